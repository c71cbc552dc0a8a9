import { DataTypes, Sequelize, type QueryInterface } from 'sequelize';

const id = { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') };
const orgRef = { type: DataTypes.UUID, allowNull: false, references: { model: 'organizations', key: 'id' }, onDelete: 'CASCADE' };
const cents = { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 };
const now = { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') };

export async function up({ context: qi }: { context: QueryInterface }) {
  // One locked row per company, year and series: numbers go up by one, with no gaps and no reuse.
  await qi.createTable('invoice_counters', {
    organization_id: { ...orgRef, primaryKey: true },
    year: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true },
    series: { type: DataTypes.STRING(10), allowNull: false, primaryKey: true },
    next_number: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
  });

  await qi.createTable('invoices', {
    id,
    organization_id: orgRef,
    booking_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'bookings', key: 'id' }, onDelete: 'RESTRICT' },
    customer_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'customers', key: 'id' }, onDelete: 'RESTRICT' },
    kind: { type: DataTypes.ENUM('deposit', 'balance', 'additional', 'credit_note'), allowNull: false },
    number: { type: DataTypes.STRING(40), allowNull: true },
    status: { type: DataTypes.ENUM('draft', 'open', 'partly_paid', 'paid', 'void'), allowNull: false, defaultValue: 'draft' },
    issue_date: { type: DataTypes.DATEONLY, allowNull: true },
    due_date: { type: DataTypes.DATEONLY, allowNull: true },
    lines: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    rental_cents: cents,
    delivery_labor_cents: cents,
    damage_waiver_cents: cents,
    damage_cents: cents,
    tax_cents: cents,
    total_cents: cents,
    paid_cents: cents,
    document_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'documents', key: 'id' }, onDelete: 'SET NULL' },
    ledger_entry_id: { type: DataTypes.UUID, allowNull: true },
    void_reason: { type: DataTypes.STRING(500), allowNull: true },
    created_by_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: now,
    updated_at: now,
  });
  await qi.sequelize.query(`CREATE UNIQUE INDEX invoices_org_number ON invoices (organization_id, number) WHERE number IS NOT NULL`);
  await qi.addIndex('invoices', ['booking_id']);
  await qi.addIndex('invoices', ['organization_id', 'status', 'due_date']);
  await qi.sequelize.query(`ALTER TABLE invoices ADD CONSTRAINT invoices_paid_within_total CHECK (paid_cents >= 0 AND paid_cents <= total_cents AND total_cents >= 0)`);

  await qi.createTable('payments', {
    id,
    organization_id: orgRef,
    booking_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'bookings', key: 'id' }, onDelete: 'RESTRICT' },
    customer_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'customers', key: 'id' }, onDelete: 'RESTRICT' },
    method: { type: DataTypes.ENUM('cash', 'check', 'transfer', 'card'), allowNull: false },
    amount_cents: { type: DataTypes.BIGINT, allowNull: false },
    reference: { type: DataTypes.STRING(80), allowNull: false, defaultValue: '' },
    received_at: { type: DataTypes.DATE, allowNull: false },
    receipt_document_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'documents', key: 'id' }, onDelete: 'SET NULL' },
    ledger_entry_id: { type: DataTypes.UUID, allowNull: true },
    recorded_by_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: now,
  });
  await qi.addIndex('payments', ['booking_id']);
  await qi.sequelize.query(`ALTER TABLE payments ADD CONSTRAINT payments_positive CHECK (amount_cents > 0)`);

  await qi.createTable('payment_allocations', {
    id,
    organization_id: orgRef,
    payment_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'payments', key: 'id' }, onDelete: 'RESTRICT' },
    invoice_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'invoices', key: 'id' }, onDelete: 'RESTRICT' },
    amount_cents: { type: DataTypes.BIGINT, allowNull: false },
  });
  await qi.addIndex('payment_allocations', ['invoice_id']);
  await qi.addIndex('payment_allocations', ['payment_id']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('payment_allocations');
  await qi.dropTable('payments');
  await qi.dropTable('invoices');
  await qi.dropTable('invoice_counters');
  await qi.sequelize.query('DROP TYPE IF EXISTS enum_invoices_kind, enum_invoices_status, enum_payments_method');
}
