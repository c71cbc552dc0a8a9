import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { InvoiceKind, InvoiceLineRow, InvoiceStatus } from '../../shared/schemas/invoices';
import { sequelize } from '../db';

/** A bill to the customer. Amounts are split by where they belong, so the ledger entry follows from them. */
export class Invoice extends Model<InferAttributes<Invoice>, InferCreationAttributes<Invoice>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare bookingId: string;
  declare customerId: string;
  declare kind: InvoiceKind;
  declare number: CreationOptional<string | null>;
  declare status: CreationOptional<InvoiceStatus>;
  declare issueDate: CreationOptional<string | null>;
  declare dueDate: CreationOptional<string | null>;
  declare lines: InvoiceLineRow[];
  declare rentalCents: number;
  declare deliveryLaborCents: number;
  declare damageWaiverCents: number;
  declare damageCents: CreationOptional<number>;
  declare taxCents: number;
  declare totalCents: number;
  declare paidCents: CreationOptional<number>;
  /** Taken off this invoice's balance by credit notes. */
  declare creditedCents: CreationOptional<number>;
  /** The credit notes' whole totals, including what became account credit: at most the invoice's total. */
  declare creditNotesCents: CreationOptional<number>;
  /** On a credit note: the invoice it lowers. */
  declare creditsInvoiceId: CreationOptional<string | null>;
  /** On a credit note: why. */
  declare reason: CreationOptional<string | null>;
  declare documentId: CreationOptional<string | null>;
  declare ledgerEntryId: CreationOptional<string | null>;
  declare voidReason: CreationOptional<string | null>;
  /** Raised when the office withdraws the invoice's pay links: a link of an older generation no longer opens. */
  declare payLinkGeneration: CreationOptional<number>;
  declare createdById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

// A function, not a shared object: Sequelize writes each attribute's column name into its definition.
const cents = () => ({ type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 });

Invoice.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    bookingId: { type: DataTypes.UUID, allowNull: false },
    customerId: { type: DataTypes.UUID, allowNull: false },
    kind: { type: DataTypes.ENUM('deposit', 'balance', 'additional', 'credit_note'), allowNull: false },
    number: { type: DataTypes.STRING(40), allowNull: true },
    status: { type: DataTypes.ENUM('draft', 'open', 'partly_paid', 'paid', 'void'), allowNull: false, defaultValue: 'draft' },
    issueDate: { type: DataTypes.DATEONLY, allowNull: true },
    dueDate: { type: DataTypes.DATEONLY, allowNull: true },
    lines: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    rentalCents: cents(),
    deliveryLaborCents: cents(),
    damageWaiverCents: cents(),
    damageCents: cents(),
    taxCents: cents(),
    totalCents: cents(),
    paidCents: cents(),
    creditedCents: cents(),
    creditNotesCents: cents(),
    creditsInvoiceId: { type: DataTypes.UUID, allowNull: true },
    reason: { type: DataTypes.STRING(500), allowNull: true },
    documentId: { type: DataTypes.UUID, allowNull: true },
    ledgerEntryId: { type: DataTypes.UUID, allowNull: true },
    voidReason: { type: DataTypes.STRING(500), allowNull: true },
    payLinkGeneration: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    createdById: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'invoices', modelName: 'Invoice' },
);
