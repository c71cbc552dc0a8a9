import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from 'sequelize';
import { sequelize } from '../db';
import type { JournalLine } from './JournalLine';

/** One money event, written once and never changed (the database refuses UPDATE and DELETE). */
export class JournalEntry extends Model<InferAttributes<JournalEntry>, InferCreationAttributes<JournalEntry>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare bookingId: string | null;
  declare customerId: string | null;
  declare occurredAt: Date;
  /** invoice_issued, payment_received, refund, credit_note, deposit_earned, security_deposit_*, reversal. */
  declare kind: string;
  declare memo: CreationOptional<string>;
  /** What caused it (an invoice, a payment ...), for the screens that explain a balance. */
  declare sourceType: string | null;
  declare sourceId: string | null;
  declare reversesId: string | null;
  declare createdById: string | null;
  declare createdAt: CreationOptional<Date>;

  declare lines?: NonAttribute<JournalLine[]>;
}

JournalEntry.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    bookingId: { type: DataTypes.UUID, allowNull: true },
    customerId: { type: DataTypes.UUID, allowNull: true },
    occurredAt: { type: DataTypes.DATE, allowNull: false },
    kind: { type: DataTypes.STRING(40), allowNull: false },
    memo: { type: DataTypes.STRING(400), allowNull: false, defaultValue: '' },
    sourceType: { type: DataTypes.STRING(40), allowNull: true },
    sourceId: { type: DataTypes.UUID, allowNull: true },
    reversesId: { type: DataTypes.UUID, allowNull: true },
    createdById: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'journal_entries', modelName: 'JournalEntry', updatedAt: false },
);
