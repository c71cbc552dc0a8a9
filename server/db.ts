import { DataTypes, Sequelize, Transaction } from 'sequelize';
import { env } from './env';
import { logger } from './logger';

// Money is BIGINT cents and measurements NUMERIC: read both as JavaScript numbers (cents stay far
// below 2^53). Set before the Sequelize instance registers its type parsers.
const pgTypes = (DataTypes as unknown as { postgres: Record<string, { parse?: (v: string) => unknown }> }).postgres;
pgTypes.BIGINT.parse = (v: string) => Number(v);
pgTypes.DECIMAL.parse = (v: string) => Number(v);

export const sequelize = new Sequelize(env.DATABASE_URL, {
  dialect: 'postgres',
  logging: (sql) => logger.trace({ sql }, 'sql'),
  define: { underscored: true, timestamps: true },
  pool: { max: 10, min: 0, idle: 10_000 },
});

/** Runs work in one transaction: committed when it resolves, rolled back when it throws. */
export function withTransaction<T>(work: (transaction: Transaction) => Promise<T>): Promise<T> {
  return sequelize.transaction((t) => work(t));
}

export type { Transaction };
