import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

export class Customer extends Model<InferAttributes<Customer>, InferCreationAttributes<Customer>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare type: CreationOptional<'person' | 'organization'>;
  declare name: string;
  declare contactName: CreationOptional<string>;
  declare email: CreationOptional<string>;
  declare phone: CreationOptional<string>;
  declare billingLine1: CreationOptional<string>;
  declare billingLine2: CreationOptional<string>;
  declare billingCity: CreationOptional<string>;
  declare billingRegion: CreationOptional<string>;
  declare billingPostalCode: CreationOptional<string>;
  declare notes: CreationOptional<string>;
  declare taxExempt: CreationOptional<boolean>;
  declare exemptionCertificateId: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

const str = (n: number) => ({ type: DataTypes.STRING(n), allowNull: false, defaultValue: '' });

Customer.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    type: { type: DataTypes.ENUM('person', 'organization'), allowNull: false, defaultValue: 'person' },
    name: { type: DataTypes.STRING(160), allowNull: false },
    contactName: str(120),
    email: str(254),
    phone: str(40),
    billingLine1: str(160),
    billingLine2: str(160),
    billingCity: str(80),
    billingRegion: str(80),
    billingPostalCode: str(20),
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    taxExempt: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    exemptionCertificateId: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'customers', modelName: 'Customer' },
);
