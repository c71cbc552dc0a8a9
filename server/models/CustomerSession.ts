import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db';

/** A one-time sign-in link for a customer's own pages; only the token's hash is stored. */
export class CustomerSignInToken extends Model<InferAttributes<CustomerSignInToken>, InferCreationAttributes<CustomerSignInToken>> {
  declare id: CreationOptional<string>;
  /** The company whose pages the link opens: a customer of two companies signs in to each. */
  declare organizationId: string;
  declare email: string;
  declare tokenHash: string;
  declare next: CreationOptional<string | null>;
  declare expiresAt: Date;
  declare usedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
}

CustomerSignInToken.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    email: { type: DataTypes.STRING(254), allowNull: false },
    tokenHash: { type: DataTypes.STRING(64), allowNull: false },
    next: { type: DataTypes.STRING(200), allowNull: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    usedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'customer_sign_in_tokens', modelName: 'CustomerSignInToken', updatedAt: false },
);

/** A customer's signed-in session: their e-mail address, with one company. */
export class CustomerSession extends Model<InferAttributes<CustomerSession>, InferCreationAttributes<CustomerSession>> {
  declare id: CreationOptional<string>;
  declare organizationId: string;
  declare email: string;
  declare expiresAt: Date;
  declare revokedAt: CreationOptional<Date | null>;
  declare ip: CreationOptional<string | null>;
  declare userAgent: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
}

CustomerSession.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    organizationId: { type: DataTypes.UUID, allowNull: false },
    email: { type: DataTypes.STRING(254), allowNull: false },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    revokedAt: { type: DataTypes.DATE, allowNull: true },
    ip: { type: DataTypes.STRING(64), allowNull: true },
    userAgent: { type: DataTypes.STRING(400), allowNull: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'customer_sessions', modelName: 'CustomerSession', updatedAt: false },
);
