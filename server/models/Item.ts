import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { ItemKind } from '../../shared/schemas/items';
import { sequelize } from '../db';

export class Item extends Model<InferAttributes<Item>, InferCreationAttributes<Item>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare name: string;
  declare kind: ItemKind;
  declare sku: CreationOptional<string>;
  declare description: CreationOptional<string>;
  declare quantityOwned: number;
  declare rentalPriceCents: number;
  declare extraDayPriceCents: CreationOptional<number>;
  declare replacementValueCents: CreationOptional<number>;
  declare purchaseCostCents: CreationOptional<number>;
  declare taxable: CreationOptional<boolean>;
  declare active: CreationOptional<boolean>;
  declare tentType: CreationOptional<'pole' | 'frame' | null>;
  declare widthFt: CreationOptional<number | null>;
  declare lengthFt: CreationOptional<number | null>;
  declare heightFt: CreationOptional<number | null>;
  declare sectionLengthFt: CreationOptional<number | null>;
  declare seats: CreationOptional<number | null>;
  declare polesPerSetup: CreationOptional<number | null>;
  declare stakesPerSetup: CreationOptional<number | null>;
  declare ballastPerSetupLbs: CreationOptional<number | null>;
  declare serviceType: CreationOptional<'delivery' | 'setup' | 'takedown' | 'other' | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Item.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    name: { type: DataTypes.STRING(120), allowNull: false },
    kind: { type: DataTypes.ENUM('tent', 'sidewall', 'table', 'chair', 'lighting', 'accessory', 'service'), allowNull: false },
    sku: { type: DataTypes.STRING(40), allowNull: false, defaultValue: '' },
    description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    quantityOwned: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    rentalPriceCents: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    extraDayPriceCents: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    replacementValueCents: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    purchaseCostCents: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    taxable: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    tentType: { type: DataTypes.ENUM('pole', 'frame'), allowNull: true },
    widthFt: { type: DataTypes.DECIMAL(8, 2), allowNull: true },
    lengthFt: { type: DataTypes.DECIMAL(8, 2), allowNull: true },
    heightFt: { type: DataTypes.DECIMAL(8, 2), allowNull: true },
    sectionLengthFt: { type: DataTypes.DECIMAL(8, 2), allowNull: true },
    seats: { type: DataTypes.INTEGER, allowNull: true },
    polesPerSetup: { type: DataTypes.INTEGER, allowNull: true },
    stakesPerSetup: { type: DataTypes.INTEGER, allowNull: true },
    ballastPerSetupLbs: { type: DataTypes.INTEGER, allowNull: true },
    serviceType: { type: DataTypes.ENUM('delivery', 'setup', 'takedown', 'other'), allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'items', modelName: 'Item' },
);
