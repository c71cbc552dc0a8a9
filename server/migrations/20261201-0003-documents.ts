import { DataTypes, Sequelize, type QueryInterface } from 'sequelize';

const id = { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') };
const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
  updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
};
const orgRef = { type: DataTypes.UUID, allowNull: false, references: { model: 'organizations', key: 'id' }, onDelete: 'CASCADE' };
const KINDS = ['rental_agreement', 'invoice', 'receipt', 'credit_note'];

export async function up({ context: qi }: { context: QueryInterface }) {
  // A company's own copies of the document and e-mail templates; the shipped defaults apply until it edits one.
  await qi.createTable('document_templates', {
    id,
    organization_id: orgRef,
    name: { type: DataTypes.STRING(60), allowNull: false },
    source: { type: DataTypes.TEXT, allowNull: false },
    updated_by_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    ...timestamps,
  });
  await qi.addIndex('document_templates', ['organization_id', 'name'], { unique: true });

  // The company's clause library, copied from the defaults the first time it is opened.
  await qi.createTable('clauses', {
    id,
    organization_id: orgRef,
    key: { type: DataTypes.STRING(60), allowNull: false },
    title: { type: DataTypes.STRING(160), allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false },
    requires_initials: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    position: { type: DataTypes.INTEGER, allowNull: false },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    ...timestamps,
  });
  await qi.addIndex('clauses', ['organization_id', 'key'], { unique: true });

  // An issued document never changes: its bytes, the values it was rendered from and their hash.
  await qi.createTable('documents', {
    id,
    organization_id: orgRef,
    booking_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'bookings', key: 'id' }, onDelete: 'RESTRICT' },
    kind: { type: DataTypes.ENUM(...KINDS), allowNull: false },
    number: { type: DataTypes.STRING(40), allowNull: false },
    version: { type: DataTypes.INTEGER, allowNull: false },
    status: { type: DataTypes.ENUM('issued', 'replaced', 'void'), allowNull: false, defaultValue: 'issued' },
    file_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'stored_files', key: 'id' }, onDelete: 'RESTRICT' },
    sha256: { type: DataTypes.STRING(64), allowNull: false },
    values: { type: DataTypes.JSONB, allowNull: false },
    markdown: { type: DataTypes.TEXT, allowNull: false },
    issued_by_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    replaced_by_id: { type: DataTypes.UUID, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('documents', ['booking_id', 'kind', 'version'], { unique: true });
  await qi.addIndex('documents', ['organization_id', 'number'], { unique: true });

  await qi.createTable('document_sends', {
    id,
    organization_id: orgRef,
    document_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'documents', key: 'id' }, onDelete: 'CASCADE' },
    to: { type: DataTypes.STRING(254), allowNull: false },
    status: { type: DataTypes.ENUM('queued', 'sent', 'failed'), allowNull: false, defaultValue: 'queued' },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    error: { type: DataTypes.TEXT, allowNull: true },
    sent_at: { type: DataTypes.DATE, allowNull: true },
    requested_by_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    ...timestamps,
  });
  await qi.addIndex('document_sends', ['document_id', 'created_at']);
  await qi.addColumn('organizations', 'next_invoice_number', { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('organizations', 'next_invoice_number');
  await qi.dropTable('document_sends');
  await qi.dropTable('documents');
  await qi.dropTable('clauses');
  await qi.dropTable('document_templates');
  await qi.sequelize.query('DROP TYPE IF EXISTS enum_documents_kind, enum_documents_status, enum_document_sends_status');
}
