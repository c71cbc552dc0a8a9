import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

/** One e-mailing of a document, with its delivery state for the booking's timeline. */
export class DocumentSend extends Model<InferAttributes<DocumentSend>, InferCreationAttributes<DocumentSend>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare documentId: string;
  declare to: string;
  declare status: CreationOptional<'queued' | 'sent' | 'failed'>;
  declare attempts: CreationOptional<number>;
  declare error: CreationOptional<string | null>;
  declare sentAt: CreationOptional<Date | null>;
  declare requestedById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

DocumentSend.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    documentId: { type: DataTypes.UUID, allowNull: false },
    to: { type: DataTypes.STRING(254), allowNull: false },
    status: { type: DataTypes.ENUM('queued', 'sent', 'failed'), allowNull: false, defaultValue: 'queued' },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    error: { type: DataTypes.TEXT, allowNull: true },
    sentAt: { type: DataTypes.DATE, allowNull: true },
    requestedById: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'document_sends', modelName: 'DocumentSend' },
);
