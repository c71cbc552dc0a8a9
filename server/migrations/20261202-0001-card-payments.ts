import { DataTypes, Sequelize, type QueryInterface } from 'sequelize';

const id = () => ({ type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') });
const orgRef = () => ({ type: DataTypes.UUID, allowNull: false, references: { model: 'organizations', key: 'id' }, onDelete: 'CASCADE' });
const now = () => ({ type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') });

/**
 * Card payments and the customer's own pages: a checkout per attempt to pay an invoice by card;
 * every webhook event stored once by its id; payments and refunds tied to the processor's ids
 * (unique, so a payment or a refund is recorded once whatever the deliveries); customers' one-time
 * sign-in links and sessions.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('card_checkouts', {
    id: id(),
    organization_id: orgRef(),
    invoice_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'invoices', key: 'id' }, onDelete: 'RESTRICT' },
    booking_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'bookings', key: 'id' }, onDelete: 'RESTRICT' },
    customer_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'customers', key: 'id' }, onDelete: 'RESTRICT' },
    amount_cents: { type: DataTypes.BIGINT, allowNull: false },
    currency: { type: DataTypes.STRING(3), allowNull: false },
    status: { type: DataTypes.ENUM('open', 'paid', 'failed', 'expired'), allowNull: false, defaultValue: 'open' },
    started_by: { type: DataTypes.ENUM('staff', 'customer', 'link'), allowNull: false },
    idempotency_key: { type: DataTypes.STRING(200), allowNull: false },
    stripe_session_id: { type: DataTypes.STRING(255), allowNull: true, unique: true },
    stripe_payment_intent_id: { type: DataTypes.STRING(255), allowNull: true },
    url: { type: DataTypes.TEXT, allowNull: true },
    message: { type: DataTypes.STRING(500), allowNull: true },
    payment_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'payments', key: 'id' }, onDelete: 'RESTRICT' },
    created_at: now(),
    updated_at: now(),
  });
  await qi.sequelize.query(`ALTER TABLE card_checkouts ADD CONSTRAINT card_checkouts_positive CHECK (amount_cents > 0)`);
  await qi.addIndex('card_checkouts', ['invoice_id']);
  await qi.addIndex('card_checkouts', ['stripe_payment_intent_id']);

  // Each event once: a redelivery finds its id here and changes nothing.
  await qi.createTable('stripe_events', {
    id: { type: DataTypes.STRING(255), primaryKey: true },
    type: { type: DataTypes.STRING(100), allowNull: false },
    payload: { type: DataTypes.JSONB, allowNull: false },
    received_at: now(),
    processed_at: { type: DataTypes.DATE, allowNull: true },
    deliveries: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
  });

  await qi.addColumn('payments', 'stripe_payment_intent_id', { type: DataTypes.STRING(255), allowNull: true, unique: true });
  await qi.addColumn('payments', 'stripe_charge_id', { type: DataTypes.STRING(255), allowNull: true });
  await qi.addColumn('refunds', 'status', { type: DataTypes.ENUM('pending', 'succeeded', 'failed'), allowNull: false, defaultValue: 'succeeded' });
  await qi.addColumn('refunds', 'stripe_refund_id', { type: DataTypes.STRING(255), allowNull: true, unique: true });
  await qi.addColumn('refunds', 'failure', { type: DataTypes.STRING(500), allowNull: true });

  await qi.createTable('customer_sign_in_tokens', {
    id: id(),
    email: { type: DataTypes.STRING(254), allowNull: false },
    token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    next: { type: DataTypes.STRING(200), allowNull: true },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: { type: DataTypes.DATE, allowNull: true },
    created_at: now(),
  });
  await qi.addIndex('customer_sign_in_tokens', ['email']);
  await qi.createTable('customer_sessions', {
    id: id(),
    email: { type: DataTypes.STRING(254), allowNull: false },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    revoked_at: { type: DataTypes.DATE, allowNull: true },
    ip: { type: DataTypes.STRING(64), allowNull: true },
    user_agent: { type: DataTypes.STRING(400), allowNull: true },
    created_at: now(),
  });
  // The portal finds a customer's bookings by e-mail across companies.
  await qi.sequelize.query(`CREATE INDEX customers_lower_email ON customers (lower(email))`);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query(`DROP INDEX IF EXISTS customers_lower_email`);
  await qi.dropTable('customer_sessions');
  await qi.dropTable('customer_sign_in_tokens');
  await qi.removeColumn('refunds', 'failure');
  await qi.removeColumn('refunds', 'stripe_refund_id');
  await qi.removeColumn('refunds', 'status');
  await qi.removeColumn('payments', 'stripe_charge_id');
  await qi.removeColumn('payments', 'stripe_payment_intent_id');
  await qi.dropTable('stripe_events');
  await qi.dropTable('card_checkouts');
  await qi.sequelize.query('DROP TYPE IF EXISTS enum_card_checkouts_status, enum_card_checkouts_started_by, enum_refunds_status');
}
