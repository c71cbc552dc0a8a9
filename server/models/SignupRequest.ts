import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

/**
 * A sign-up waiting for its e-mailed link. Every sign-up makes one, whether or not the address
 * already has an account, so the answer and its cost are the same; the job that mails the link
 * (jobs/accountRequests.ts) finds out which, and sends the link or a note instead.
 */
export class SignupRequest extends Model<InferAttributes<SignupRequest>, InferCreationAttributes<SignupRequest>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare organizationName: string;
  declare name: string;
  declare passwordHash: string | null;
  declare tokenHash: CreationOptional<string | null>;
  declare expiresAt: Date;
  declare usedAt: CreationOptional<Date | null>;
  declare ip: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

SignupRequest.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    email: { type: DataTypes.STRING(254), allowNull: false },
    organizationName: { type: DataTypes.STRING(160), allowNull: false },
    name: { type: DataTypes.STRING(120), allowNull: false },
    passwordHash: { type: DataTypes.STRING(100), allowNull: true },
    tokenHash: { type: DataTypes.STRING(64), allowNull: true, unique: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    usedAt: { type: DataTypes.DATE, allowNull: true },
    ip: { type: DataTypes.STRING(64), allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'signup_requests', modelName: 'SignupRequest' },
);
