import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

/** A link that lets the customer sign one issued rental agreement; only the token's hash is kept. */
export class SigningRequest extends Model<InferAttributes<SigningRequest>, InferCreationAttributes<SigningRequest>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare documentId: string;
  declare bookingId: string;
  declare tokenHash: string;
  declare status: CreationOptional<'pending' | 'signed' | 'void' | 'replaced' | 'declined'>;
  declare sentTo: string;
  declare expiresAt: Date;
  declare consentedAt: CreationOptional<Date | null>;
  declare signedAt: CreationOptional<Date | null>;
  declare typedName: CreationOptional<string | null>;
  declare signedDocumentId: CreationOptional<string | null>;
  declare createdById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

SigningRequest.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    documentId: { type: DataTypes.UUID, allowNull: false },
    bookingId: { type: DataTypes.UUID, allowNull: false },
    tokenHash: { type: DataTypes.STRING(64), allowNull: false },
    status: { type: DataTypes.ENUM('pending', 'signed', 'void', 'replaced', 'declined'), allowNull: false, defaultValue: 'pending' },
    sentTo: { type: DataTypes.STRING(254), allowNull: false },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    consentedAt: { type: DataTypes.DATE, allowNull: true },
    signedAt: { type: DataTypes.DATE, allowNull: true },
    typedName: { type: DataTypes.STRING(200), allowNull: true },
    signedDocumentId: { type: DataTypes.UUID, allowNull: true },
    createdById: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'signing_requests', modelName: 'SigningRequest' },
);
