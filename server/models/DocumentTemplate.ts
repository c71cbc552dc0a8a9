import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

/** A company's own copy of a template (rental-agreement, invoice, email-invoice...). */
export class DocumentTemplate extends Model<InferAttributes<DocumentTemplate>, InferCreationAttributes<DocumentTemplate>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare name: string;
  declare source: string;
  declare updatedById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

DocumentTemplate.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    name: { type: DataTypes.STRING(60), allowNull: false },
    source: { type: DataTypes.TEXT, allowNull: false },
    updatedById: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'document_templates', modelName: 'DocumentTemplate' },
);
