import type { Request, Response } from 'express';
import { QueryTypes } from 'sequelize';
import { sequelize } from '../db';

/** How long the database may take to answer before the health check calls it down. */
const DATABASE_CHECK_MS = 2_000;

/** Whether PostgreSQL answers `SELECT 1` within the time limit, through the app's own pool. */
async function databaseAnswers(): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const late = new Promise<false>((resolve) => {
    timer = setTimeout(() => resolve(false), DATABASE_CHECK_MS);
  });
  const check = sequelize.query('SELECT 1', { type: QueryTypes.SELECT }).then(
    () => true,
    () => false,
  );
  try {
    return await Promise.race([check, late]);
  } finally {
    clearTimeout(timer);
  }
}

/**
 * GET /api/health, for a load balancer or a monitor: 200 `{ ok: true, database: 'up' }` when this
 * process can use the database, 503 `{ ok: false, database: 'down' }` when it cannot (take the
 * process out of rotation; it reconnects by itself when the database is back).
 */
export async function health(_req: Request, res: Response) {
  if (await databaseAnswers()) return res.json({ ok: true, database: 'up' });
  res.setHeader('Retry-After', '5');
  res.status(503).json({ ok: false, database: 'down' });
}
