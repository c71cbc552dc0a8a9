import { Sequelize, Transaction } from 'sequelize';
import { env } from './env';
import { logger } from './logger';

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
