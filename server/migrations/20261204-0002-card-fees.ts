import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * The card processor's fee on each card payment (null: not known, e.g. the processor could not be
 * asked), and the "Card processing fees" expense account for companies whose chart already
 * exists. It takes code 6100, or the next free ten in 6100-6990 when the company already used 6100
 * for something else; new companies get it from the default chart (server/ledger/chart.ts).
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('payments', 'fee_cents', { type: DataTypes.BIGINT, allowNull: true });
  await qi.sequelize.query(`
    INSERT INTO accounts (organization_id, code, name, type, system_key)
    SELECT o.organization_id,
           (SELECT g::text FROM generate_series(6100, 6990, 10) g
             WHERE NOT EXISTS (SELECT 1 FROM accounts a WHERE a.organization_id = o.organization_id AND a.code = g::text)
             ORDER BY g LIMIT 1),
           'Card processing fees', 'expense', 'card_processing_fees'
      FROM (SELECT DISTINCT organization_id FROM accounts WHERE system_key IS NOT NULL) o
     WHERE NOT EXISTS (SELECT 1 FROM accounts a WHERE a.organization_id = o.organization_id AND a.system_key = 'card_processing_fees')
    ON CONFLICT DO NOTHING`);
}

/**
 * Drops the column and the fee accounts nothing was posted to. An account that holds fee entries
 * stays: journal lines are never deleted, so the account they point at cannot be either.
 */
export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query(`
    DELETE FROM accounts a
     WHERE a.system_key = 'card_processing_fees'
       AND NOT EXISTS (SELECT 1 FROM journal_lines l WHERE l.account_id = a.id)`);
  await qi.removeColumn('payments', 'fee_cents');
}
