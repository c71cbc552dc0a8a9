import pg from 'pg';
import { env } from '../../env';

/**
 * The exports' own small pool, beside Sequelize's. An export holds its connection for as long as
 * the download lasts (minutes, for years of journal over a slow line); with a pool of their own,
 * a few long downloads can never take the connections that ordinary requests need.
 */
let pool: pg.Pool | null = null;

export function exportPool(): pg.Pool {
  pool ??= new pg.Pool({
    connectionString: env.DATABASE_URL,
    max: 4,
    idleTimeoutMillis: 10_000,
    // An idle pool does not keep a test run or a stopping server alive.
    allowExitOnIdle: true,
    application_name: 'guyline-exports',
  });
  return pool;
}

export async function closeExportPool(): Promise<void> {
  const p = pool;
  pool = null;
  await p?.end();
}

const BYTEA_OID = 17;
const byteaParser = pg.types.getTypeParser(BYTEA_OID, 'text');

/**
 * Rows come back as PostgreSQL's own text: money stays exact digits ("12345" cents, never a
 * float) and dates stay YYYY-MM-DD. Only file bytes are decoded, to Buffers.
 */
export const RAW_TEXT_TYPES = {
  getTypeParser: (oid: number) => (oid === BYTEA_OID ? byteaParser : (value: string) => value),
};
