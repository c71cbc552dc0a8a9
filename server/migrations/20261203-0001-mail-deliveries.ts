import { DataTypes, Sequelize, type QueryInterface } from 'sequelize';

/**
 * One row per e-mail a job hands to the SMTP server, keyed by what asked for it (the mail job's id,
 * the document send's id). A retried job finds its row: `sent` means the SMTP server already took
 * the message, so nothing is sent again; `sending` means an earlier attempt died between handing
 * the message over and hearing back (see services/mailer.ts deliverOnce).
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('mail_deliveries', {
    key: { type: DataTypes.STRING(100), primaryKey: true },
    message_id: { type: DataTypes.STRING(255), allowNull: false },
    status: { type: DataTypes.ENUM('sending', 'sent', 'failed'), allowNull: false },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    /** Attempts that found the previous one still `sending`: it died without knowing whether the server took the message. */
    interrupted: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    error: { type: DataTypes.STRING(500), allowNull: true },
    started_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
    sent_at: { type: DataTypes.DATE, allowNull: true },
  });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('mail_deliveries');
  await qi.sequelize.query('DROP TYPE IF EXISTS "enum_mail_deliveries_status"');
}
