import { DataTypes, Sequelize, type QueryInterface } from 'sequelize';

const id = { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') };
const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
  updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
};
const orgRef = { type: DataTypes.UUID, allowNull: false, references: { model: 'organizations', key: 'id' }, onDelete: 'CASCADE' };
const cents = (allowNull = false) => ({ type: DataTypes.BIGINT, allowNull, defaultValue: allowNull ? null : 0 });
const str = (n: number) => ({ type: DataTypes.STRING(n), allowNull: false, defaultValue: '' });

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('organizations', 'rules', { type: DataTypes.JSONB, allowNull: false, defaultValue: {} });
  await qi.addColumn('organizations', 'next_booking_number', { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1001 });

  await qi.createTable('stored_files', {
    id,
    organization_id: orgRef,
    filename: { type: DataTypes.STRING(255), allowNull: false },
    content_type: { type: DataTypes.STRING(100), allowNull: false },
    size: { type: DataTypes.INTEGER, allowNull: false },
    sha256: { type: DataTypes.STRING(64), allowNull: false },
    data: { type: DataTypes.BLOB, allowNull: false },
    purpose: { type: DataTypes.STRING(60), allowNull: false },
    ...timestamps,
  });

  await qi.createTable('items', {
    id,
    organization_id: orgRef,
    name: { type: DataTypes.STRING(120), allowNull: false },
    kind: { type: DataTypes.ENUM('tent', 'sidewall', 'table', 'chair', 'lighting', 'accessory', 'service'), allowNull: false },
    sku: str(40),
    description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    quantity_owned: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    rental_price_cents: cents(),
    extra_day_price_cents: cents(),
    replacement_value_cents: cents(),
    purchase_cost_cents: cents(),
    taxable: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    tent_type: { type: DataTypes.ENUM('pole', 'frame'), allowNull: true },
    width_ft: { type: DataTypes.DECIMAL(8, 2), allowNull: true },
    length_ft: { type: DataTypes.DECIMAL(8, 2), allowNull: true },
    height_ft: { type: DataTypes.DECIMAL(8, 2), allowNull: true },
    section_length_ft: { type: DataTypes.DECIMAL(8, 2), allowNull: true },
    seats: { type: DataTypes.INTEGER, allowNull: true },
    poles_per_setup: { type: DataTypes.INTEGER, allowNull: true },
    stakes_per_setup: { type: DataTypes.INTEGER, allowNull: true },
    ballast_per_setup_lbs: { type: DataTypes.INTEGER, allowNull: true },
    service_type: { type: DataTypes.ENUM('delivery', 'setup', 'takedown', 'other'), allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('items', ['organization_id', 'kind']);
  await qi.sequelize.query(`CREATE UNIQUE INDEX items_org_sku ON items (organization_id, lower(sku)) WHERE sku <> ''`);
  await qi.sequelize.query(`ALTER TABLE items ADD CONSTRAINT items_money_nonnegative CHECK (quantity_owned >= 0 AND rental_price_cents >= 0 AND extra_day_price_cents >= 0 AND replacement_value_cents >= 0 AND purchase_cost_cents >= 0)`);

  await qi.createTable('customers', {
    id,
    organization_id: orgRef,
    type: { type: DataTypes.ENUM('person', 'organization'), allowNull: false, defaultValue: 'person' },
    name: { type: DataTypes.STRING(160), allowNull: false },
    contact_name: str(120),
    email: str(254),
    phone: str(40),
    billing_line1: str(160),
    billing_line2: str(160),
    billing_city: str(80),
    billing_region: str(80),
    billing_postal_code: str(20),
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    tax_exempt: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    exemption_certificate_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'stored_files', key: 'id' }, onDelete: 'SET NULL' },
    ...timestamps,
  });
  await qi.addIndex('customers', ['organization_id', 'name']);

  await qi.createTable('bookings', {
    id,
    organization_id: orgRef,
    reference: { type: DataTypes.STRING(20), allowNull: false },
    status: { type: DataTypes.ENUM('draft', 'quoted', 'reserved', 'out', 'returned', 'closed', 'cancelled'), allowNull: false, defaultValue: 'draft' },
    customer_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'customers', key: 'id' }, onDelete: 'RESTRICT' },
    event_start: { type: DataTypes.DATE, allowNull: false },
    event_end: { type: DataTypes.DATE, allowNull: false },
    delivery_start: { type: DataTypes.DATE, allowNull: false },
    delivery_end: { type: DataTypes.DATE, allowNull: false },
    pickup_start: { type: DataTypes.DATE, allowNull: false },
    pickup_end: { type: DataTypes.DATE, allowNull: false },
    site_line1: str(160),
    site_line2: str(160),
    site_city: str(80),
    site_region: str(80),
    site_postal_code: str(20),
    site_notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    surface: { type: DataTypes.ENUM('grass', 'soil', 'gravel', 'asphalt', 'concrete'), allowNull: false, defaultValue: 'grass' },
    anchoring: { type: DataTypes.ENUM('stakes', 'ballast'), allowNull: false, defaultValue: 'stakes' },
    utility_locate_number: str(60),
    utility_locate_date: { type: DataTypes.DATEONLY, allowNull: true },
    guest_count: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    seating: { type: DataTypes.ENUM('banquet', 'rows', 'standing', 'mixed'), allowNull: false, defaultValue: 'banquet' },
    after_dark: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    delivery_miles: { type: DataTypes.DECIMAL(7, 1), allowNull: true },
    setup_labor_cents: cents(),
    discount_bp: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    discount_cents: cents(),
    damage_waiver: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    own_insurance: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    tax_rate_bp: { type: DataTypes.DECIMAL(8, 2), allowNull: false, defaultValue: 0 },
    security_deposit_cents: cents(),
    currency: { type: DataTypes.STRING(3), allowNull: false, defaultValue: 'USD' },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    total_cents: cents(),
    ...timestamps,
  });
  await qi.addIndex('bookings', ['organization_id', 'reference'], { unique: true });
  await qi.addIndex('bookings', ['organization_id', 'status', 'event_start']);
  await qi.addIndex('bookings', ['organization_id', 'delivery_start', 'pickup_end']);

  await qi.createTable('booking_lines', {
    id,
    organization_id: orgRef,
    booking_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'bookings', key: 'id' }, onDelete: 'CASCADE' },
    position: { type: DataTypes.INTEGER, allowNull: false },
    item_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'items', key: 'id' }, onDelete: 'RESTRICT' },
    description: { type: DataTypes.STRING(200), allowNull: false },
    quantity: { type: DataTypes.INTEGER, allowNull: false },
    unit_price_cents: cents(),
    extra_days: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    extra_day_price_cents: cents(),
    discount_bp: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    discount_cents: cents(),
    taxable: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    kind: { type: DataTypes.ENUM('rental', 'fee'), allowNull: false, defaultValue: 'rental' },
    ...timestamps,
  });
  await qi.addIndex('booking_lines', ['booking_id', 'position']);
  await qi.addIndex('booking_lines', ['item_id']);
  await qi.sequelize.query(`ALTER TABLE booking_lines ADD CONSTRAINT booking_lines_nonnegative CHECK (quantity > 0 AND unit_price_cents >= 0 AND extra_days >= 0)`);

  // Every time a booking asked for more than was free: the purchasing report reads these.
  await qi.createTable('shortfalls', {
    id,
    organization_id: orgRef,
    item_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'items', key: 'id' }, onDelete: 'CASCADE' },
    booking_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'bookings', key: 'id' }, onDelete: 'SET NULL' },
    requested: { type: DataTypes.INTEGER, allowNull: false },
    available: { type: DataTypes.INTEGER, allowNull: false },
    shortfall: { type: DataTypes.INTEGER, allowNull: false },
    window_start: { type: DataTypes.DATE, allowNull: false },
    window_end: { type: DataTypes.DATE, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
  });
  await qi.addIndex('shortfalls', ['organization_id', 'item_id']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('shortfalls');
  await qi.dropTable('booking_lines');
  await qi.dropTable('bookings');
  await qi.dropTable('customers');
  await qi.dropTable('items');
  await qi.dropTable('stored_files');
  await qi.removeColumn('organizations', 'next_booking_number');
  await qi.removeColumn('organizations', 'rules');
  await qi.sequelize.query(
    'DROP TYPE IF EXISTS enum_items_kind, enum_items_tent_type, enum_items_service_type, enum_customers_type, enum_bookings_status, enum_bookings_surface, enum_bookings_anchoring, enum_bookings_seating, enum_booking_lines_kind',
  );
}
