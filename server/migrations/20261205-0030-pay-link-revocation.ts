import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * Pay links get an end and can be withdrawn. A link now carries its end date and the invoice's
 * pay-link generation under its HMAC; withdrawing the links of an invoice raises the generation,
 * so every link made before stops working while a new one can be sent (services/payLinks.ts).
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('invoices', 'pay_link_generation', { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('invoices', 'pay_link_generation');
}
