import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

import { STORED_DOCUMENT_KINDS, type StoredDocumentKind } from '../../shared/schemas/documents';

/** An issued document: immutable once written; a change makes a new version and marks this one replaced. */
export class Document extends Model<InferAttributes<Document>, InferCreationAttributes<Document>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare bookingId: string;
  declare kind: StoredDocumentKind;
  declare number: string;
  declare version: number;
  declare status: CreationOptional<'issued' | 'replaced' | 'void'>;
  declare fileId: string;
  declare sha256: string;
  declare values: Record<string, unknown>;
  declare markdown: string;
  /** The exact issue time the PDF was rendered with (a re-render with it is byte-identical). */
  declare issuedAt: CreationOptional<Date>;
  declare issuedById: string | null;
  declare replacedById: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Document.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    bookingId: { type: DataTypes.UUID, allowNull: false },
    kind: { type: DataTypes.ENUM(...STORED_DOCUMENT_KINDS), allowNull: false },
    number: { type: DataTypes.STRING(40), allowNull: false },
    version: { type: DataTypes.INTEGER, allowNull: false },
    status: { type: DataTypes.ENUM('issued', 'replaced', 'void'), allowNull: false, defaultValue: 'issued' },
    fileId: { type: DataTypes.UUID, allowNull: false },
    sha256: { type: DataTypes.STRING(64), allowNull: false },
    values: { type: DataTypes.JSONB, allowNull: false },
    markdown: { type: DataTypes.TEXT, allowNull: false },
    issuedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    issuedById: { type: DataTypes.UUID, allowNull: true },
    replacedById: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'documents', modelName: 'Document' },
);
