import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from 'sequelize';
import { sequelize } from '../db';

/** The pickup check-in of a booking: saved as the crew counts, finished once submitted. */
export class ReturnCheck extends Model<InferAttributes<ReturnCheck>, InferCreationAttributes<ReturnCheck>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare bookingId: string;
  declare notes: CreationOptional<string>;
  declare savedById: CreationOptional<string | null>;
  declare submittedAt: CreationOptional<Date | null>;
  declare submittedById: CreationOptional<string | null>;
  /** The additional-charges invoice the office made from it. */
  declare chargesInvoiceId: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare lines?: NonAttribute<ReturnCheckLine[]>;
}

ReturnCheck.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    bookingId: { type: DataTypes.UUID, allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    savedById: { type: DataTypes.UUID, allowNull: true },
    submittedAt: { type: DataTypes.DATE, allowNull: true },
    submittedById: { type: DataTypes.UUID, allowNull: true },
    chargesInvoiceId: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'return_checks', modelName: 'ReturnCheck' },
);

/** One line of the check-in: of `sent`, how many came back and how many of those are damaged. */
export class ReturnCheckLine extends Model<InferAttributes<ReturnCheckLine>, InferCreationAttributes<ReturnCheckLine>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare returnCheckId: string;
  /** The catalog item's id, or "text:" and the description for a line outside the catalog. */
  declare lineKey: string;
  declare itemId: string | null;
  declare description: string;
  declare sent: number;
  declare returned: number;
  declare damaged: CreationOptional<number>;
  declare notes: CreationOptional<string>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

ReturnCheckLine.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    returnCheckId: { type: DataTypes.UUID, allowNull: false },
    lineKey: { type: DataTypes.STRING(260), allowNull: false },
    itemId: { type: DataTypes.UUID, allowNull: true },
    description: { type: DataTypes.STRING(200), allowNull: false },
    sent: { type: DataTypes.INTEGER, allowNull: false },
    returned: { type: DataTypes.INTEGER, allowNull: false },
    damaged: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'return_check_lines', modelName: 'ReturnCheckLine' },
);
