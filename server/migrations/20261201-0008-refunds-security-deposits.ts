import { DataTypes, Sequelize, type QueryInterface } from 'sequelize';

const id = { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') };
const orgRef = { type: DataTypes.UUID, allowNull: false, references: { model: 'organizations', key: 'id' }, onDelete: 'CASCADE' };
const bookingRef = { type: DataTypes.UUID, allowNull: false, references: { model: 'bookings', key: 'id' }, onDelete: 'RESTRICT' };
const userRef = { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' };
const now = { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') };

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('refunds', {
    id,
    organization_id: orgRef,
    payment_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'payments', key: 'id' }, onDelete: 'RESTRICT' },
    booking_id: bookingRef,
    amount_cents: { type: DataTypes.BIGINT, allowNull: false },
    reason: { type: DataTypes.STRING(500), allowNull: false },
    ledger_entry_id: { type: DataTypes.UUID, allowNull: true },
    created_by_id: userRef,
    created_at: now,
  });
  await qi.sequelize.query(`ALTER TABLE refunds ADD CONSTRAINT refunds_positive CHECK (amount_cents > 0)`);
  await qi.addIndex('refunds', ['payment_id']);

  // Security deposits taken, returned or kept for damage; the ledger holds the money side.
  await qi.createTable('security_deposit_moves', {
    id,
    organization_id: orgRef,
    booking_id: bookingRef,
    kind: { type: DataTypes.ENUM('held', 'refunded', 'kept'), allowNull: false },
    amount_cents: { type: DataTypes.BIGINT, allowNull: false },
    method: { type: DataTypes.ENUM('cash', 'check', 'transfer', 'card'), allowNull: true },
    reason: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
    ledger_entry_id: { type: DataTypes.UUID, allowNull: true },
    created_by_id: userRef,
    created_at: now,
  });
  await qi.sequelize.query(`ALTER TABLE security_deposit_moves ADD CONSTRAINT security_deposit_moves_positive CHECK (amount_cents > 0)`);
  await qi.addIndex('security_deposit_moves', ['booking_id']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('security_deposit_moves');
  await qi.dropTable('refunds');
  await qi.sequelize.query('DROP TYPE IF EXISTS enum_security_deposit_moves_kind, enum_security_deposit_moves_method');
}
