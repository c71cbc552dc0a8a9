import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { ExportKind, ExportStatus } from '../../shared/schemas/exports';
import { sequelize } from '../db';

/** One export a person ran: which, for what dates, how it ended, how many rows and bytes went out. */
export class ExportRun extends Model<InferAttributes<ExportRun>, InferCreationAttributes<ExportRun>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare userId: string | null;
  declare kind: ExportKind;
  /** Null for the trial balance, which has a closing date only. */
  declare fromDate: string | null;
  declare toDate: string;
  declare status: CreationOptional<ExportStatus>;
  /** Data rows (CSV, without the header) or files (ZIP) sent. */
  declare rowCount: CreationOptional<number>;
  declare byteCount: CreationOptional<number>;
  declare error: CreationOptional<string | null>;
  declare startedAt: CreationOptional<Date>;
  declare finishedAt: CreationOptional<Date | null>;
}

ExportRun.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    userId: { type: DataTypes.UUID, allowNull: true },
    kind: { type: DataTypes.STRING(40), allowNull: false },
    fromDate: { type: DataTypes.DATEONLY, allowNull: true },
    toDate: { type: DataTypes.DATEONLY, allowNull: false },
    status: { type: DataTypes.ENUM('running', 'ok', 'failed', 'aborted'), allowNull: false, defaultValue: 'running' },
    rowCount: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    byteCount: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    error: { type: DataTypes.STRING(500), allowNull: true },
    startedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    finishedAt: { type: DataTypes.DATE, allowNull: true },
  },
  { sequelize, tableName: 'export_runs', modelName: 'ExportRun', timestamps: false },
);
