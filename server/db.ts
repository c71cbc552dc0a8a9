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
  // Named prepared statements (preparedQuery) keep one generic plan: PostgreSQL's default kept
  // planning the bookings list afresh on every run, which cost a third of its time (npm run bench).
  // Sequelize's own queries are unnamed and planned each time whatever this says.
  dialectOptions: { options: '-c plan_cache_mode=force_generic_plan' },
});

/** Runs work in one transaction: committed when it resolves, rolled back when it throws. */
export function withTransaction<T>(work: (transaction: Transaction) => Promise<T>): Promise<T> {
  return sequelize.transaction((t) => work(t));
}

export type { Transaction };

/**
 * A named prepared statement on a connection of Sequelize's pool: PostgreSQL plans it once per
 * connection and reuses the plan under its name, where Sequelize's own queries are planned on
 * every call. For the hottest reads (every request's session, the bookings list). Values go as
 * parameters, never into the text; rows come back as pg reads them.
 */
export async function preparedQuery<T>(name: string, text: string, values: unknown[]): Promise<T[]> {
  const manager = sequelize.connectionManager as unknown as {
    getConnection(o: object): Promise<import('pg').PoolClient>;
    releaseConnection(c: import('pg').PoolClient): Promise<void>;
  };
  const connection = await manager.getConnection({ type: 'SELECT' });
  try {
    return (await connection.query({ name, text, values })).rows as T[];
  } finally {
    await manager.releaseConnection(connection);
  }
}
