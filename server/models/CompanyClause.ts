import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

/** One clause of a company's clause library (table `clauses`). */
export class CompanyClause extends Model<InferAttributes<CompanyClause>, InferCreationAttributes<CompanyClause>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare key: string;
  declare title: string;
  declare body: string;
  declare requiresInitials: boolean;
  declare position: number;
  declare active: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

CompanyClause.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    key: { type: DataTypes.STRING(60), allowNull: false },
    title: { type: DataTypes.STRING(160), allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false },
    requiresInitials: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    position: { type: DataTypes.INTEGER, allowNull: false },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'clauses', modelName: 'CompanyClause' },
);
