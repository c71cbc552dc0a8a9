import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

/** Money given back on a payment; never more than the payment less earlier refunds. */
export class Refund extends Model<InferAttributes<Refund>, InferCreationAttributes<Refund>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare paymentId: string;
  declare bookingId: string;
  declare amountCents: number;
  declare reason: string;
  declare ledgerEntryId: CreationOptional<string | null>;
  /** Card refunds wait for the processor's confirmation; others succeed at once. */
  declare status: CreationOptional<'pending' | 'succeeded' | 'failed'>;
  declare stripeRefundId: CreationOptional<string | null>;
  declare failure: CreationOptional<string | null>;
  declare createdById: string | null;
  declare createdAt: CreationOptional<Date>;
}

Refund.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    paymentId: { type: DataTypes.UUID, allowNull: false },
    bookingId: { type: DataTypes.UUID, allowNull: false },
    amountCents: { type: DataTypes.BIGINT, allowNull: false },
    reason: { type: DataTypes.STRING(500), allowNull: false },
    ledgerEntryId: { type: DataTypes.UUID, allowNull: true },
    status: { type: DataTypes.ENUM('pending', 'succeeded', 'failed'), allowNull: false, defaultValue: 'succeeded' },
    stripeRefundId: { type: DataTypes.STRING(255), allowNull: true },
    failure: { type: DataTypes.STRING(500), allowNull: true },
    createdById: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'refunds', modelName: 'Refund', updatedAt: false },
);

/** A security deposit taken, returned or kept for damage. */
export class SecurityDepositMove extends Model<InferAttributes<SecurityDepositMove>, InferCreationAttributes<SecurityDepositMove>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare bookingId: string;
  declare kind: 'held' | 'refunded' | 'kept' | 'applied';
  declare amountCents: number;
  declare method: 'cash' | 'check' | 'transfer' | 'card' | null;
  declare reason: CreationOptional<string>;
  declare ledgerEntryId: CreationOptional<string | null>;
  declare createdById: string | null;
  declare createdAt: CreationOptional<Date>;
}

SecurityDepositMove.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    bookingId: { type: DataTypes.UUID, allowNull: false },
    kind: { type: DataTypes.ENUM('held', 'refunded', 'kept', 'applied'), allowNull: false },
    amountCents: { type: DataTypes.BIGINT, allowNull: false },
    method: { type: DataTypes.ENUM('cash', 'check', 'transfer', 'card'), allowNull: true },
    reason: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
    ledgerEntryId: { type: DataTypes.UUID, allowNull: true },
    createdById: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'security_deposit_moves', modelName: 'SecurityDepositMove', updatedAt: false },
);
