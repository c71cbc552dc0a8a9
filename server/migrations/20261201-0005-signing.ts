import { DataTypes, Sequelize, type QueryInterface } from 'sequelize';

const id = { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') };
const orgRef = { type: DataTypes.UUID, allowNull: false, references: { model: 'organizations', key: 'id' }, onDelete: 'CASCADE' };

export async function up({ context: qi }: { context: QueryInterface }) {
  // The company's own signing certificate; the private key is encrypted with SIGNING_KEY_SECRET.
  await qi.addColumn('organizations', 'certificate_pem', { type: DataTypes.TEXT, allowNull: true });
  await qi.addColumn('organizations', 'certificate_fingerprint', { type: DataTypes.STRING(64), allowNull: true });
  await qi.addColumn('organizations', 'private_key_encrypted', { type: DataTypes.TEXT, allowNull: true });

  await qi.sequelize.query(`ALTER TYPE enum_documents_kind ADD VALUE IF NOT EXISTS 'signed_agreement'`);
  await qi.addColumn('documents', 'issued_at', { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') });
  await qi.sequelize.query('UPDATE documents SET issued_at = created_at');

  await qi.createTable('signing_requests', {
    id,
    organization_id: orgRef,
    document_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'documents', key: 'id' }, onDelete: 'CASCADE' },
    booking_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'bookings', key: 'id' }, onDelete: 'CASCADE' },
    token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    status: { type: DataTypes.ENUM('pending', 'signed', 'void', 'replaced', 'declined'), allowNull: false, defaultValue: 'pending' },
    sent_to: { type: DataTypes.STRING(254), allowNull: false },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    consented_at: { type: DataTypes.DATE, allowNull: true },
    signed_at: { type: DataTypes.DATE, allowNull: true },
    typed_name: { type: DataTypes.STRING(200), allowNull: true },
    signed_document_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'documents', key: 'id' }, onDelete: 'SET NULL' },
    created_by_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
  });
  await qi.addIndex('signing_requests', ['booking_id', 'status']);

  // The audit trail printed on the certificate page: server-side times, addresses and browsers.
  await qi.createTable('signing_events', {
    id,
    organization_id: orgRef,
    signing_request_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'signing_requests', key: 'id' }, onDelete: 'CASCADE' },
    event: {
      type: DataTypes.ENUM('sent', 'opened', 'consented', 'consent_withdrawn', 'initialed', 'signed', 'voided', 'replaced', 'refused_stock'),
      allowNull: false,
    },
    at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('clock_timestamp()') },
    ip: { type: DataTypes.STRING(64), allowNull: true },
    user_agent: { type: DataTypes.STRING(400), allowNull: true },
    detail: { type: DataTypes.STRING(200), allowNull: true },
  });
  await qi.addIndex('signing_events', ['signing_request_id', 'at']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('signing_events');
  await qi.dropTable('signing_requests');
  await qi.sequelize.query('DROP TYPE IF EXISTS enum_signing_events_event, enum_signing_requests_status');
  await qi.removeColumn('documents', 'issued_at');
  await qi.removeColumn('organizations', 'private_key_encrypted');
  await qi.removeColumn('organizations', 'certificate_fingerprint');
  await qi.removeColumn('organizations', 'certificate_pem');
}
