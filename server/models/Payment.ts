import { RECEIPT_METHODS, type ReceiptMethod } from '../../shared/schemas/invoices';
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

export class Payment extends Model<InferAttributes<Payment>, InferCreationAttributes<Payment>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare bookingId: string;
  declare customerId: string;
  declare method: ReceiptMethod;
  /** The part of an overpayment kept as the customer's credit. */
  declare creditCents: CreationOptional<number>;
  /** Card payments: the processor's payment intent (unique: a card payment is recorded once) and charge. */
  declare stripePaymentIntentId: CreationOptional<string | null>;
  declare stripeChargeId: CreationOptional<string | null>;
  /** Card payments: what the processor kept of the amount (its balance transaction's fee); null when not known. */
  declare feeCents: CreationOptional<number | null>;
  declare amountCents: number;
  declare reference: CreationOptional<string>;
  declare receivedAt: Date;
  declare receiptDocumentId: CreationOptional<string | null>;
  declare ledgerEntryId: CreationOptional<string | null>;
  declare recordedById: string | null;
  declare createdAt: CreationOptional<Date>;
}

Payment.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    bookingId: { type: DataTypes.UUID, allowNull: false },
    customerId: { type: DataTypes.UUID, allowNull: false },
    method: { type: DataTypes.ENUM(...RECEIPT_METHODS), allowNull: false },
    creditCents: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    stripePaymentIntentId: { type: DataTypes.STRING(255), allowNull: true },
    stripeChargeId: { type: DataTypes.STRING(255), allowNull: true },
    feeCents: { type: DataTypes.BIGINT, allowNull: true },
    amountCents: { type: DataTypes.BIGINT, allowNull: false },
    reference: { type: DataTypes.STRING(80), allowNull: false, defaultValue: '' },
    receivedAt: { type: DataTypes.DATE, allowNull: false },
    receiptDocumentId: { type: DataTypes.UUID, allowNull: true },
    ledgerEntryId: { type: DataTypes.UUID, allowNull: true },
    recordedById: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'payments', modelName: 'Payment', updatedAt: false },
);

export class PaymentAllocation extends Model<InferAttributes<PaymentAllocation>, InferCreationAttributes<PaymentAllocation>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare paymentId: string;
  declare invoiceId: string;
  declare amountCents: number;
}

PaymentAllocation.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    paymentId: { type: DataTypes.UUID, allowNull: false },
    invoiceId: { type: DataTypes.UUID, allowNull: false },
    amountCents: { type: DataTypes.BIGINT, allowNull: false },
  },
  { sequelize, tableName: 'payment_allocations', modelName: 'PaymentAllocation', timestamps: false },
);
