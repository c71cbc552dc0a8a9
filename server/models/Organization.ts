import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

export class Organization extends Model<InferAttributes<Organization>, InferCreationAttributes<Organization>> {
  declare id: CreationOptional<string>;
  declare name: string;
  declare addressLine1: CreationOptional<string>;
  declare addressLine2: CreationOptional<string>;
  declare city: CreationOptional<string>;
  declare region: CreationOptional<string>;
  declare postalCode: CreationOptional<string>;
  declare country: CreationOptional<string>;
  declare phone: CreationOptional<string>;
  declare email: CreationOptional<string>;
  declare currency: CreationOptional<string>;
  declare timeZone: CreationOptional<string>;
  /** The company's own numbers (CompanyRules in shared/schemas/rules.ts), read through `rulesOf()`. */
  declare rules: CreationOptional<Record<string, unknown>>;
  declare nextBookingNumber: CreationOptional<number>;
  declare nextInvoiceNumber: CreationOptional<number>;
  declare logoFileId: CreationOptional<string | null>;
  declare certificatePem: CreationOptional<string | null>;
  declare certificateFingerprint: CreationOptional<string | null>;
  declare privateKeyEncrypted: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Organization.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    name: { type: DataTypes.STRING(160), allowNull: false },
    addressLine1: { type: DataTypes.STRING(160), allowNull: false, defaultValue: '' },
    addressLine2: { type: DataTypes.STRING(160), allowNull: false, defaultValue: '' },
    city: { type: DataTypes.STRING(80), allowNull: false, defaultValue: '' },
    region: { type: DataTypes.STRING(80), allowNull: false, defaultValue: '' },
    postalCode: { type: DataTypes.STRING(20), allowNull: false, defaultValue: '' },
    country: { type: DataTypes.STRING(2), allowNull: false, defaultValue: 'US' },
    phone: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
    email: { type: DataTypes.STRING(254), allowNull: false, defaultValue: '' },
    currency: { type: DataTypes.STRING(3), allowNull: false, defaultValue: 'USD' },
    timeZone: { type: DataTypes.STRING(64), allowNull: false, defaultValue: 'America/Chicago' },
    rules: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    nextBookingNumber: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1001 },
    nextInvoiceNumber: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    logoFileId: { type: DataTypes.UUID, allowNull: true },
    certificatePem: { type: DataTypes.TEXT, allowNull: true },
    certificateFingerprint: { type: DataTypes.STRING(64), allowNull: true },
    privateKeyEncrypted: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'organizations', modelName: 'Organization' },
);
