import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * A customer's sign-in link and session belong to one company. Until now a customer was only an
 * e-mail address, so a company could put someone's address on its own record and show its
 * invoices on pages that also carried another company's bookings. Links and sessions made
 * before this have no company: they are ended (a customer asks for a new link in a minute).
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query(`DELETE FROM customer_sign_in_tokens`);
  await qi.sequelize.query(`DELETE FROM customer_sessions`);
  for (const table of ['customer_sign_in_tokens', 'customer_sessions']) {
    await qi.addColumn(table, 'organization_id', {
      type: DataTypes.UUID, allowNull: false, references: { model: 'organizations', key: 'id' }, onDelete: 'CASCADE',
    });
  }
}

export async function down({ context: qi }: { context: QueryInterface }) {
  for (const table of ['customer_sign_in_tokens', 'customer_sessions']) await qi.removeColumn(table, 'organization_id');
}
