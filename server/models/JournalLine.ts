import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

/** One side of a journal entry: exactly one of debitCents and creditCents is above zero. */
export class JournalLine extends Model<InferAttributes<JournalLine>, InferCreationAttributes<JournalLine>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare entryId: string;
  declare position: number;
  declare accountId: string;
  declare debitCents: number;
  declare creditCents: number;
  /** On customer-deposit lines: the revenue account's system key this amount becomes when earned. */
  declare revenueKey: string | null;
}

JournalLine.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    entryId: { type: DataTypes.UUID, allowNull: false },
    position: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 0 },
    accountId: { type: DataTypes.UUID, allowNull: false },
    debitCents: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    creditCents: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    revenueKey: { type: DataTypes.STRING(40), allowNull: true },
  },
  { sequelize, tableName: 'journal_lines', modelName: 'JournalLine', timestamps: false },
);
