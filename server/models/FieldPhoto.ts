import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { PhotoStage } from '../../shared/schemas/field';
import { sequelize } from '../db';

/** A photo the crew took on a booking's site; the bytes are a stored file. */
export class FieldPhoto extends Model<InferAttributes<FieldPhoto>, InferCreationAttributes<FieldPhoto>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare bookingId: string;
  declare storedFileId: string;
  declare stage: PhotoStage;
  /** For damage: the return line it shows. */
  declare lineKey: CreationOptional<string>;
  declare caption: CreationOptional<string>;
  declare uploadedById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

FieldPhoto.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    bookingId: { type: DataTypes.UUID, allowNull: false },
    storedFileId: { type: DataTypes.UUID, allowNull: false },
    stage: { type: DataTypes.ENUM('site', 'delivered', 'set_up', 'return', 'damage'), allowNull: false },
    lineKey: { type: DataTypes.STRING(260), allowNull: false, defaultValue: '' },
    caption: { type: DataTypes.STRING(200), allowNull: false, defaultValue: '' },
    uploadedById: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'field_photos', modelName: 'FieldPhoto' },
);
