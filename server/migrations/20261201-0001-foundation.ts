import { DataTypes, Sequelize, type QueryInterface } from 'sequelize';

const id = { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') };
const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
  updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
};
const orgRef = {
  type: DataTypes.UUID,
  allowNull: false,
  references: { model: 'organizations', key: 'id' },
  onDelete: 'CASCADE',
};

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('organizations', {
    id,
    name: { type: DataTypes.STRING(160), allowNull: false },
    address_line1: { type: DataTypes.STRING(160), allowNull: false, defaultValue: '' },
    address_line2: { type: DataTypes.STRING(160), allowNull: false, defaultValue: '' },
    city: { type: DataTypes.STRING(80), allowNull: false, defaultValue: '' },
    region: { type: DataTypes.STRING(80), allowNull: false, defaultValue: '' },
    postal_code: { type: DataTypes.STRING(20), allowNull: false, defaultValue: '' },
    country: { type: DataTypes.STRING(2), allowNull: false, defaultValue: 'US' },
    phone: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
    email: { type: DataTypes.STRING(254), allowNull: false, defaultValue: '' },
    currency: { type: DataTypes.STRING(3), allowNull: false, defaultValue: 'USD' },
    time_zone: { type: DataTypes.STRING(64), allowNull: false, defaultValue: 'America/Chicago' },
    ...timestamps,
  });

  await qi.createTable('users', {
    id,
    organization_id: orgRef,
    name: { type: DataTypes.STRING(120), allowNull: false },
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    password_hash: { type: DataTypes.STRING(100), allowNull: true },
    role: { type: DataTypes.ENUM('owner', 'office', 'crew', 'bookkeeper'), allowNull: false },
    status: { type: DataTypes.ENUM('invited', 'active', 'disabled'), allowNull: false, defaultValue: 'active' },
    last_sign_in_at: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('users', ['organization_id']);

  await qi.createTable('sessions', {
    id,
    organization_id: orgRef,
    user_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    revoked_at: { type: DataTypes.DATE, allowNull: true },
    ip: { type: DataTypes.STRING(64), allowNull: true },
    user_agent: { type: DataTypes.STRING(400), allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('sessions', ['user_id']);

  await qi.createTable('auth_tokens', {
    id,
    organization_id: orgRef,
    user_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    purpose: { type: DataTypes.ENUM('invite', 'password_reset'), allowNull: false },
    token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('auth_tokens', ['user_id', 'purpose']);

  await qi.createTable('audit_logs', {
    id,
    organization_id: orgRef,
    actor_user_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    action: { type: DataTypes.STRING(80), allowNull: false },
    subject_type: { type: DataTypes.STRING(60), allowNull: false },
    subject_id: { type: DataTypes.UUID, allowNull: true },
    data: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    ip: { type: DataTypes.STRING(64), allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
  });
  await qi.addIndex('audit_logs', ['organization_id', 'created_at']);

  // Counters of the rate limiter (rate-limiter-flexible's RateLimiterPostgres layout), shared by every app process.
  await qi.createTable('rate_limits', {
    key: { type: DataTypes.STRING(255), primaryKey: true },
    points: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    expire: { type: DataTypes.BIGINT, allowNull: true },
  });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('rate_limits');
  await qi.dropTable('audit_logs');
  await qi.dropTable('auth_tokens');
  await qi.dropTable('sessions');
  await qi.dropTable('users');
  await qi.dropTable('organizations');
  await qi.sequelize.query('DROP TYPE IF EXISTS enum_users_role, enum_users_status, enum_auth_tokens_purpose');
}
