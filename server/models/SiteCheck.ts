import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { PrivateLines } from '../../shared/schemas/field';
import { sequelize } from '../db';

/** The site checklist of a booking's delivery, with the crew's ready-to-stake, delivered and set-up marks. */
export class SiteCheck extends Model<InferAttributes<SiteCheck>, InferCreationAttributes<SiteCheck>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare bookingId: string;
  declare locateRequested: CreationOptional<boolean>;
  declare locateRequestedOn: CreationOptional<string | null>;
  declare locateNumber: CreationOptional<string>;
  declare hardSurfaceBallast: CreationOptional<boolean>;
  declare privateLines: CreationOptional<PrivateLines>;
  declare privateLinesNotes: CreationOptional<string>;
  declare buildingClearanceFt: CreationOptional<number | null>;
  declare lotLineClearanceFt: CreationOptional<number | null>;
  declare windMph: CreationOptional<number | null>;
  declare exitsPlanned: CreationOptional<boolean>;
  declare notes: CreationOptional<string>;
  declare updatedById: CreationOptional<string | null>;
  declare readyToStakeAt: CreationOptional<Date | null>;
  declare readyToStakeById: CreationOptional<string | null>;
  declare deliveredAt: CreationOptional<Date | null>;
  declare deliveredById: CreationOptional<string | null>;
  declare setUpAt: CreationOptional<Date | null>;
  declare setUpById: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

// Fresh objects for each attribute: Model.init writes each one's column name into its definition.
const by = () => ({ type: DataTypes.UUID, allowNull: true });
const when = () => ({ type: DataTypes.DATE, allowNull: true });

SiteCheck.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    bookingId: { type: DataTypes.UUID, allowNull: false },
    locateRequested: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    locateRequestedOn: { type: DataTypes.DATEONLY, allowNull: true },
    locateNumber: { type: DataTypes.STRING(60), allowNull: false, defaultValue: '' },
    hardSurfaceBallast: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    privateLines: { type: DataTypes.ENUM('not_asked', 'none', 'marked'), allowNull: false, defaultValue: 'not_asked' },
    privateLinesNotes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    buildingClearanceFt: { type: DataTypes.DECIMAL(8, 1), allowNull: true },
    lotLineClearanceFt: { type: DataTypes.DECIMAL(8, 1), allowNull: true },
    windMph: { type: DataTypes.INTEGER, allowNull: true },
    exitsPlanned: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    updatedById: by(),
    readyToStakeAt: when(),
    readyToStakeById: by(),
    deliveredAt: when(),
    deliveredById: by(),
    setUpAt: when(),
    setUpById: by(),
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'site_checks', modelName: 'SiteCheck' },
);
