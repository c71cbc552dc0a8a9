import { DataTypes, Sequelize, type QueryInterface } from 'sequelize';

export async function up({ context: qi }: { context: QueryInterface }) {
  // One row per reminder that went out: the primary key makes each one go out once, whatever runs twice.
  await qi.createTable('reminders_sent', {
    kind: { type: DataTypes.STRING(40), allowNull: false, primaryKey: true },
    subject_id: { type: DataTypes.UUID, allowNull: false, primaryKey: true },
    organization_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'organizations', key: 'id' }, onDelete: 'CASCADE' },
    booking_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'bookings', key: 'id' }, onDelete: 'CASCADE' },
    sent_to: { type: DataTypes.STRING(254), allowNull: false },
    sent_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
  });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('reminders_sent');
}
