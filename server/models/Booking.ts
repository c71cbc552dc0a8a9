import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from 'sequelize';
import type { BookingStatus } from '../../shared/schemas/bookings';
import type { SeatingStyle } from '../../shared/schemas/rules';
import { sequelize } from '../db';
import type { BookingLine } from './BookingLine';
import type { Customer } from './Customer';

export class Booking extends Model<InferAttributes<Booking>, InferCreationAttributes<Booking>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare reference: string;
  declare status: BookingStatus;
  declare customerId: string;
  declare eventStart: Date;
  declare eventEnd: Date;
  declare deliveryStart: Date;
  declare deliveryEnd: Date;
  declare pickupStart: Date;
  declare pickupEnd: Date;
  declare siteLine1: CreationOptional<string>;
  declare siteLine2: CreationOptional<string>;
  declare siteCity: CreationOptional<string>;
  declare siteRegion: CreationOptional<string>;
  declare sitePostalCode: CreationOptional<string>;
  declare siteNotes: CreationOptional<string>;
  declare surface: CreationOptional<'grass' | 'soil' | 'gravel' | 'asphalt' | 'concrete'>;
  declare anchoring: CreationOptional<'stakes' | 'ballast'>;
  declare utilityLocateNumber: CreationOptional<string>;
  declare utilityLocateDate: CreationOptional<string | null>;
  declare guestCount: CreationOptional<number>;
  declare seating: CreationOptional<SeatingStyle>;
  declare afterDark: CreationOptional<boolean>;
  declare deliveryMiles: CreationOptional<number | null>;
  declare setupLaborCents: CreationOptional<number>;
  declare discountBp: CreationOptional<number>;
  declare discountCents: CreationOptional<number>;
  declare damageWaiver: CreationOptional<boolean>;
  declare ownInsurance: CreationOptional<boolean>;
  declare taxRateBp: CreationOptional<number>;
  declare securityDepositCents: CreationOptional<number>;
  declare currency: CreationOptional<string>;
  declare notes: CreationOptional<string>;
  /** The quote total when last saved, for lists and sorting; the lines are the truth. */
  declare totalCents: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare customer?: NonAttribute<Customer>;
  declare lines?: NonAttribute<BookingLine[]>;
}

const str = (n: number) => ({ type: DataTypes.STRING(n), allowNull: false, defaultValue: '' });

Booking.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    reference: { type: DataTypes.STRING(20), allowNull: false },
    status: { type: DataTypes.ENUM('draft', 'quoted', 'reserved', 'out', 'returned', 'closed', 'cancelled'), allowNull: false, defaultValue: 'draft' },
    customerId: { type: DataTypes.UUID, allowNull: false },
    eventStart: { type: DataTypes.DATE, allowNull: false },
    eventEnd: { type: DataTypes.DATE, allowNull: false },
    deliveryStart: { type: DataTypes.DATE, allowNull: false },
    deliveryEnd: { type: DataTypes.DATE, allowNull: false },
    pickupStart: { type: DataTypes.DATE, allowNull: false },
    pickupEnd: { type: DataTypes.DATE, allowNull: false },
    siteLine1: str(160),
    siteLine2: str(160),
    siteCity: str(80),
    siteRegion: str(80),
    sitePostalCode: str(20),
    siteNotes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    surface: { type: DataTypes.ENUM('grass', 'soil', 'gravel', 'asphalt', 'concrete'), allowNull: false, defaultValue: 'grass' },
    anchoring: { type: DataTypes.ENUM('stakes', 'ballast'), allowNull: false, defaultValue: 'stakes' },
    utilityLocateNumber: str(60),
    utilityLocateDate: { type: DataTypes.DATEONLY, allowNull: true },
    guestCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    seating: { type: DataTypes.ENUM('banquet', 'rows', 'standing', 'mixed'), allowNull: false, defaultValue: 'banquet' },
    afterDark: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    deliveryMiles: { type: DataTypes.DECIMAL(7, 1), allowNull: true },
    setupLaborCents: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    discountBp: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    discountCents: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    damageWaiver: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    ownInsurance: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    taxRateBp: { type: DataTypes.DECIMAL(8, 2), allowNull: false, defaultValue: 0 },
    securityDepositCents: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    currency: { type: DataTypes.STRING(3), allowNull: false, defaultValue: 'USD' },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    totalCents: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'bookings', modelName: 'Booking' },
);
