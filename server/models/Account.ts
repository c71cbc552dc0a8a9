import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

export type AccountType = 'asset' | 'liability' | 'equity' | 'revenue' | 'expense' | 'contra_revenue';

/** One account of a company's chart; `systemKey` is the role the posting rules post to. */
export class Account extends Model<InferAttributes<Account>, InferCreationAttributes<Account>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare code: string;
  declare name: string;
  declare type: AccountType;
  declare systemKey: string | null;
  declare active: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Account.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    code: { type: DataTypes.STRING(10), allowNull: false },
    name: { type: DataTypes.STRING(120), allowNull: false },
    type: { type: DataTypes.ENUM('asset', 'liability', 'equity', 'revenue', 'expense', 'contra_revenue'), allowNull: false },
    systemKey: { type: DataTypes.STRING(40), allowNull: true },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'accounts', modelName: 'Account' },
);
