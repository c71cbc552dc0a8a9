import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

/** A time a booking asked for more of an item than was free; read by the purchasing report. */
export class Shortfall extends Model<InferAttributes<Shortfall>, InferCreationAttributes<Shortfall>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare itemId: string;
  declare bookingId: string | null;
  declare requested: number;
  declare available: number;
  declare shortfall: number;
  declare windowStart: Date;
  declare windowEnd: Date;
  declare createdAt: CreationOptional<Date>;
}

Shortfall.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    itemId: { type: DataTypes.UUID, allowNull: false },
    bookingId: { type: DataTypes.UUID, allowNull: true },
    requested: { type: DataTypes.INTEGER, allowNull: false },
    available: { type: DataTypes.INTEGER, allowNull: false },
    shortfall: { type: DataTypes.INTEGER, allowNull: false },
    windowStart: { type: DataTypes.DATE, allowNull: false },
    windowEnd: { type: DataTypes.DATE, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'shortfalls', modelName: 'Shortfall', updatedAt: false },
);
