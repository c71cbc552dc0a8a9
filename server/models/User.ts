import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { ROLES, USER_STATUSES, type Role, type UserStatus } from '../../shared/types';
import { sequelize } from '../db';

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare name: string;
  declare email: string;
  declare passwordHash: string | null;
  declare role: Role;
  declare status: UserStatus;
  declare lastSignInAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

User.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    name: { type: DataTypes.STRING(120), allowNull: false },
    // Unique among accounts (users with a password) and within a company; see migration 20261205-0010.
    email: { type: DataTypes.STRING(254), allowNull: false },
    passwordHash: { type: DataTypes.STRING(100), allowNull: true },
    role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
    status: { type: DataTypes.ENUM(...USER_STATUSES), allowNull: false, defaultValue: 'active' },
    lastSignInAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'users', modelName: 'User' },
);
