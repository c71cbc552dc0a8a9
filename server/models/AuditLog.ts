import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

/** One row per change worth answering for later: who did what to which record, from where. */
export class AuditLog extends Model<InferAttributes<AuditLog>, InferCreationAttributes<AuditLog>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare actorUserId: string | null;
  declare action: string;
  declare subjectType: string;
  declare subjectId: string | null;
  declare data: CreationOptional<Record<string, unknown>>;
  declare ip: string | null;
  declare createdAt: CreationOptional<Date>;
}

AuditLog.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    actorUserId: { type: DataTypes.UUID, allowNull: true },
    action: { type: DataTypes.STRING(80), allowNull: false },
    subjectType: { type: DataTypes.STRING(60), allowNull: false },
    subjectId: { type: DataTypes.UUID, allowNull: true },
    data: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    ip: { type: DataTypes.STRING(64), allowNull: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'audit_logs', modelName: 'AuditLog', updatedAt: false },
);
