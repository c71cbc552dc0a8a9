import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from 'sequelize';
import { sequelize } from '../db';
import type { Item } from './Item';

export class BookingLine extends Model<InferAttributes<BookingLine>, InferCreationAttributes<BookingLine>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare bookingId: string;
  declare position: number;
  declare itemId: string | null;
  declare description: string;
  declare quantity: number;
  declare unitPriceCents: number;
  declare extraDays: CreationOptional<number>;
  declare extraDayPriceCents: CreationOptional<number>;
  declare discountBp: CreationOptional<number>;
  declare discountCents: CreationOptional<number>;
  declare taxable: CreationOptional<boolean>;
  declare kind: CreationOptional<'rental' | 'fee'>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare item?: NonAttribute<Item | null>;
}

BookingLine.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    bookingId: { type: DataTypes.UUID, allowNull: false },
    position: { type: DataTypes.INTEGER, allowNull: false },
    itemId: { type: DataTypes.UUID, allowNull: true },
    description: { type: DataTypes.STRING(200), allowNull: false },
    quantity: { type: DataTypes.INTEGER, allowNull: false },
    unitPriceCents: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    extraDays: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    extraDayPriceCents: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    discountBp: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    discountCents: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    taxable: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    kind: { type: DataTypes.ENUM('rental', 'fee'), allowNull: false, defaultValue: 'rental' },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'booking_lines', modelName: 'BookingLine' },
);
