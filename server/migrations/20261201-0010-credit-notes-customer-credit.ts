import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * Credit notes point at the invoice they lower and say why; invoices keep what credit notes took
 * off. Payments keep the part held as the customer's credit (an overpayment), and may come from
 * the held security deposit or from that credit as well as from money.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('invoices', 'credited_cents', { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 });
  // Every credit note's total, including the part that became account credit: the limit of further credit notes.
  await qi.addColumn('invoices', 'credit_notes_cents', { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 });
  await qi.addColumn('invoices', 'credits_invoice_id', { type: DataTypes.UUID, allowNull: true, references: { model: 'invoices', key: 'id' }, onDelete: 'RESTRICT' });
  await qi.addColumn('invoices', 'reason', { type: DataTypes.STRING(500), allowNull: true });
  await qi.addIndex('invoices', ['credits_invoice_id']);
  await qi.sequelize.query(`ALTER TABLE invoices ADD CONSTRAINT invoices_credited_within_total CHECK (credited_cents >= 0 AND credited_cents <= credit_notes_cents AND credit_notes_cents <= total_cents)`);
  await qi.sequelize.query(`ALTER TABLE invoices ADD CONSTRAINT invoices_settled_within_total CHECK (paid_cents >= 0 AND paid_cents + credited_cents <= total_cents)`);

  await qi.addColumn('payments', 'credit_cents', { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 });
  await qi.sequelize.query(`ALTER TABLE payments ADD CONSTRAINT payments_credit_within_amount CHECK (credit_cents >= 0 AND credit_cents <= amount_cents)`);
  await qi.sequelize.query(`ALTER TYPE enum_payments_method ADD VALUE IF NOT EXISTS 'security_deposit'`);
  await qi.sequelize.query(`ALTER TYPE enum_payments_method ADD VALUE IF NOT EXISTS 'credit'`);
  await qi.sequelize.query(`ALTER TYPE enum_security_deposit_moves_kind ADD VALUE IF NOT EXISTS 'applied'`);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query(`ALTER TABLE payments DROP CONSTRAINT IF EXISTS payments_credit_within_amount`);
  await qi.removeColumn('payments', 'credit_cents');
  await qi.sequelize.query(`ALTER TABLE invoices DROP CONSTRAINT IF EXISTS invoices_settled_within_total`);
  await qi.sequelize.query(`ALTER TABLE invoices DROP CONSTRAINT IF EXISTS invoices_credited_within_total`);
  await qi.removeColumn('invoices', 'reason');
  await qi.removeColumn('invoices', 'credits_invoice_id');
  await qi.removeColumn('invoices', 'credited_cents');
  await qi.removeColumn('invoices', 'credit_notes_cents');
  // PostgreSQL cannot drop an enum value; the two payment methods stay unused.
}
