import { DataTypes, Sequelize, type QueryInterface } from 'sequelize';

const id = { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') };
const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
  updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
};
const orgRef = { type: DataTypes.UUID, allowNull: false, references: { model: 'organizations', key: 'id' }, onDelete: 'CASCADE' };
const bookingRef = { type: DataTypes.UUID, allowNull: false, references: { model: 'bookings', key: 'id' }, onDelete: 'CASCADE' };
const userRef = (allowNull: boolean) => ({ type: DataTypes.UUID, allowNull, references: { model: 'users', key: 'id' }, onDelete: allowNull ? 'SET NULL' : 'CASCADE' });
const str = (n: number) => ({ type: DataTypes.STRING(n), allowNull: false, defaultValue: '' });
const when = () => ({ type: DataTypes.DATE, allowNull: true });

export async function up({ context: qi }: { context: QueryInterface }) {
  // Who goes out on a booking.
  await qi.createTable('booking_crew', {
    id,
    organization_id: orgRef,
    booking_id: bookingRef,
    user_id: userRef(false),
    ...timestamps,
  });
  await qi.addIndex('booking_crew', ['booking_id', 'user_id'], { unique: true });
  await qi.addIndex('booking_crew', ['user_id']);

  // A crew member's calendar feed: the secret is in the URL, only its SHA-256 is kept.
  await qi.createTable('calendar_feeds', {
    id,
    organization_id: orgRef,
    user_id: userRef(false),
    token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    revoked_at: when(),
    last_used_at: when(),
    ...timestamps,
  });
  // At most one live feed per person: making a new one revokes the old.
  await qi.sequelize.query('CREATE UNIQUE INDEX calendar_feeds_one_live ON calendar_feeds (user_id) WHERE revoked_at IS NULL');

  // The site checklist of a booking's delivery, with the crew's marks.
  await qi.createTable('site_checks', {
    id,
    organization_id: orgRef,
    booking_id: { ...bookingRef, unique: true },
    locate_requested: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    locate_requested_on: { type: DataTypes.DATEONLY, allowNull: true },
    locate_number: str(60),
    hard_surface_ballast: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    private_lines: { type: DataTypes.ENUM('not_asked', 'none', 'marked'), allowNull: false, defaultValue: 'not_asked' },
    private_lines_notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    building_clearance_ft: { type: DataTypes.DECIMAL(8, 1), allowNull: true },
    lot_line_clearance_ft: { type: DataTypes.DECIMAL(8, 1), allowNull: true },
    wind_mph: { type: DataTypes.INTEGER, allowNull: true },
    exits_planned: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    updated_by_id: userRef(true),
    ready_to_stake_at: when(),
    ready_to_stake_by_id: userRef(true),
    delivered_at: when(),
    delivered_by_id: userRef(true),
    set_up_at: when(),
    set_up_by_id: userRef(true),
    ...timestamps,
  });
  // The locate rule, kept by the database too: ready to stake needs a ticket number or a declared hard surface with ballast.
  await qi.sequelize.query(
    "ALTER TABLE site_checks ADD CONSTRAINT site_checks_locate_rule CHECK (ready_to_stake_at IS NULL OR locate_number <> '' OR hard_surface_ballast)",
  );

  // The pickup check-in: what came back of each line, and the damage.
  await qi.createTable('return_checks', {
    id,
    organization_id: orgRef,
    booking_id: { ...bookingRef, unique: true },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    saved_by_id: userRef(true),
    submitted_at: when(),
    submitted_by_id: userRef(true),
    charges_invoice_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'invoices', key: 'id' }, onDelete: 'SET NULL' },
    ...timestamps,
  });
  await qi.createTable('return_check_lines', {
    id,
    organization_id: orgRef,
    return_check_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'return_checks', key: 'id' }, onDelete: 'CASCADE' },
    line_key: { type: DataTypes.STRING(260), allowNull: false },
    item_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'items', key: 'id' }, onDelete: 'SET NULL' },
    description: { type: DataTypes.STRING(200), allowNull: false },
    sent: { type: DataTypes.INTEGER, allowNull: false },
    returned: { type: DataTypes.INTEGER, allowNull: false },
    damaged: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    ...timestamps,
  });
  await qi.addIndex('return_check_lines', ['return_check_id', 'line_key'], { unique: true });
  await qi.sequelize.query('ALTER TABLE return_check_lines ADD CONSTRAINT return_check_lines_counts CHECK (damaged >= 0 AND damaged <= returned AND returned >= 0 AND returned <= sent)');

  // Photos from the field, stored with the booking; the bytes live in stored_files.
  await qi.createTable('field_photos', {
    id,
    organization_id: orgRef,
    booking_id: bookingRef,
    stored_file_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'stored_files', key: 'id' }, onDelete: 'CASCADE' },
    stage: { type: DataTypes.ENUM('site', 'delivered', 'set_up', 'return', 'damage'), allowNull: false },
    line_key: str(260),
    caption: str(200),
    uploaded_by_id: userRef(true),
    ...timestamps,
  });
  await qi.addIndex('field_photos', ['booking_id', 'created_at']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('field_photos');
  await qi.dropTable('return_check_lines');
  await qi.dropTable('return_checks');
  await qi.dropTable('site_checks');
  await qi.dropTable('calendar_feeds');
  await qi.dropTable('booking_crew');
  await qi.sequelize.query('DROP TYPE IF EXISTS enum_site_checks_private_lines, enum_field_photos_stage');
}
