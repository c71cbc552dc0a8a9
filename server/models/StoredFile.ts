import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

/** File bytes kept in PostgreSQL behind services/storage.ts, so an object store can replace it later. */
export class StoredFile extends Model<InferAttributes<StoredFile>, InferCreationAttributes<StoredFile>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare filename: string;
  declare contentType: string;
  declare size: number;
  declare sha256: string;
  declare data: Buffer;
  declare purpose: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

StoredFile.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    filename: { type: DataTypes.STRING(255), allowNull: false },
    contentType: { type: DataTypes.STRING(100), allowNull: false },
    size: { type: DataTypes.INTEGER, allowNull: false },
    sha256: { type: DataTypes.STRING(64), allowNull: false },
    data: { type: DataTypes.BLOB, allowNull: false },
    purpose: { type: DataTypes.STRING(60), allowNull: false },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  // Bytes are loaded only when asked for.
  { sequelize, tableName: 'stored_files', modelName: 'StoredFile', defaultScope: { attributes: { exclude: ['data'] } } },
);
