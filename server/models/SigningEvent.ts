import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { SigningEventKind } from '../../shared/schemas/signing';
import { sequelize } from '../db';

export class SigningEvent extends Model<InferAttributes<SigningEvent>, InferCreationAttributes<SigningEvent>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare signingRequestId: string;
  declare event: SigningEventKind;
  declare at: CreationOptional<Date>;
  declare ip: string | null;
  declare userAgent: string | null;
  declare detail: string | null;
}

SigningEvent.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    signingRequestId: { type: DataTypes.UUID, allowNull: false },
    event: {
      type: DataTypes.ENUM('sent', 'opened', 'consented', 'consent_withdrawn', 'initialed', 'signed', 'voided', 'replaced', 'refused_stock'),
      allowNull: false,
    },
    at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    ip: { type: DataTypes.STRING(64), allowNull: true },
    userAgent: { type: DataTypes.STRING(400), allowNull: true },
    detail: { type: DataTypes.STRING(200), allowNull: true },
  },
  { sequelize, tableName: 'signing_events', modelName: 'SigningEvent', timestamps: false },
);
