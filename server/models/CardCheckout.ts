import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { CheckoutStatus } from '../../shared/schemas/portal';
import { sequelize } from '../db';

/** One attempt to pay an invoice by card on the processor's hosted page. */
export class CardCheckout extends Model<InferAttributes<CardCheckout>, InferCreationAttributes<CardCheckout>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare invoiceId: string;
  declare bookingId: string;
  declare customerId: string;
  declare amountCents: number;
  declare currency: string;
  declare status: CreationOptional<CheckoutStatus>;
  declare startedBy: 'staff' | 'customer' | 'link';
  declare idempotencyKey: string;
  declare stripeSessionId: CreationOptional<string | null>;
  declare stripePaymentIntentId: CreationOptional<string | null>;
  declare url: CreationOptional<string | null>;
  /** Why the last attempt failed, in plain words. */
  declare message: CreationOptional<string | null>;
  declare paymentId: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

CardCheckout.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    invoiceId: { type: DataTypes.UUID, allowNull: false },
    bookingId: { type: DataTypes.UUID, allowNull: false },
    customerId: { type: DataTypes.UUID, allowNull: false },
    amountCents: { type: DataTypes.BIGINT, allowNull: false },
    currency: { type: DataTypes.STRING(3), allowNull: false },
    status: { type: DataTypes.ENUM('open', 'paid', 'failed', 'expired'), allowNull: false, defaultValue: 'open' },
    startedBy: { type: DataTypes.ENUM('staff', 'customer', 'link'), allowNull: false },
    idempotencyKey: { type: DataTypes.STRING(200), allowNull: false },
    stripeSessionId: { type: DataTypes.STRING(255), allowNull: true },
    stripePaymentIntentId: { type: DataTypes.STRING(255), allowNull: true },
    url: { type: DataTypes.TEXT, allowNull: true },
    message: { type: DataTypes.STRING(500), allowNull: true },
    paymentId: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'card_checkouts', modelName: 'CardCheckout' },
);

/** A webhook event, stored once by the processor's id. */
export class StripeEvent extends Model<InferAttributes<StripeEvent>, InferCreationAttributes<StripeEvent>> {
  declare id: string;
  declare type: string;
  declare payload: Record<string, unknown>;
  declare receivedAt: CreationOptional<Date>;
  declare processedAt: CreationOptional<Date | null>;
  declare deliveries: CreationOptional<number>;
}

StripeEvent.init(
  {
    id: { type: DataTypes.STRING(255), primaryKey: true },
    type: { type: DataTypes.STRING(100), allowNull: false },
    payload: { type: DataTypes.JSONB, allowNull: false },
    receivedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    processedAt: { type: DataTypes.DATE, allowNull: true },
    deliveries: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
  },
  { sequelize, tableName: 'stripe_events', modelName: 'StripeEvent', timestamps: false },
);
