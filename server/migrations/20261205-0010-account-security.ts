import { DataTypes, Sequelize, type QueryInterface } from 'sequelize';

/**
 * Staff addresses can no longer be squatted or listed:
 * - An address is taken by an account (a user with a password), not by an invitation: an
 *   unaccepted invitation from one company never blocks the person's own sign-up, and several
 *   companies may invite the same address. Within one company an address appears once.
 * - A sign-up is a request first (`signup_requests`), confirmed from the e-mailed link; the
 *   answer to it is the same whether or not the address already has an account.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query('ALTER TABLE users DROP CONSTRAINT IF EXISTS users_email_key');
  await qi.sequelize.query('CREATE UNIQUE INDEX users_account_email ON users (email) WHERE password_hash IS NOT NULL');
  await qi.sequelize.query('CREATE UNIQUE INDEX users_organization_email ON users (organization_id, email)');

  await qi.createTable('signup_requests', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') },
    email: { type: DataTypes.STRING(254), allowNull: false },
    organization_name: { type: DataTypes.STRING(160), allowNull: false },
    name: { type: DataTypes.STRING(120), allowNull: false },
    // Cleared once the request is used, or when the address turned out to have an account.
    password_hash: { type: DataTypes.STRING(100), allowNull: true },
    // Set by the job that mails the link (only the SHA-256 of the token is kept).
    token_hash: { type: DataTypes.STRING(64), allowNull: true, unique: true },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: { type: DataTypes.DATE, allowNull: true },
    ip: { type: DataTypes.STRING(64), allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
  });
  await qi.addIndex('signup_requests', ['email']);
  await qi.addIndex('signup_requests', ['expires_at']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('signup_requests');
  await qi.sequelize.query('DROP INDEX IF EXISTS users_organization_email');
  await qi.sequelize.query('DROP INDEX IF EXISTS users_account_email');
  await qi.sequelize.query('ALTER TABLE users ADD CONSTRAINT users_email_key UNIQUE (email)');
}
