import { randomUUID } from 'node:crypto';
import { Transform, type Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Response } from 'express';
import type pg from 'pg';
import { addDays, zonedTimeToInstant } from '../../../shared/dates';
import { exportFilename, type ExportKind } from '../../../shared/schemas/exports';
import { QueryTypes } from 'sequelize';
import { sequelize } from '../../db';
import { logger } from '../../logger';
import { contentDisposition } from '../downloads';
import { ExportRun, type Organization, type User } from '../../models';
import { exportPool } from './db';

/** What an export's writer gets: its connection (in a read-only snapshot), the range as instants, and a row counter. */
export interface ExportContext {
  client: pg.PoolClient;
  organizationId: string;
  timeZone: string;
  currency: string;
  /** First day, YYYY-MM-DD (the trial balance: null). */
  from: string | null;
  /** Last day, YYYY-MM-DD, included. */
  to: string;
  /** The first instant of `from` and the first instant after `to`, on the company's calendar. */
  fromInstant: Date | null;
  untilInstant: Date;
  /** Call once per data row (CSV) or file (ZIP) sent. */
  count(): void;
}

export type ExportWriter = (ctx: ExportContext, out: Writable) => Promise<void>;

const CONTENT_TYPES = { csv: 'text/csv; charset=utf-8; header=present', zip: 'application/zip' } as const;

/** The company-calendar range as instants: [start of `from`, start of the day after `to`). */
export function rangeInstants(from: string | null, to: string, timeZone: string) {
  return {
    fromInstant: from ? zonedTimeToInstant(from, '00:00', timeZone) : null,
    untilInstant: zonedTimeToInstant(addDays(to, 1), '00:00', timeZone),
  };
}

/**
 * Runs one export as a download: a history row, the download headers, a dedicated connection in a
 * read-only REPEATABLE READ snapshot (every query of the export sees the same books), the writer
 * streaming into the response with back-pressure, and the history row closed as ok, failed or
 * aborted before the response ends. The connection holds an advisory lock on the run for as long
 * as its row says running, and goes back to the pool on every path; after an error or an abort it
 * is closed rather than reused, since a cursor may still be open on it.
 */
export async function runExport(
  res: Response,
  opts: { user: User; organization: Organization; kind: ExportKind; format: 'csv' | 'zip'; from: string | null; to: string; write: ExportWriter },
): Promise<void> {
  const { user, organization, kind, from, to } = opts;
  // The connection first, holding the run's lock (see sweepStoppedRuns), then the history row:
  // a row that says running always has a live process behind it.
  const runId = randomUUID();
  const client = await exportPool().connect();
  try {
    await client.query('SELECT pg_advisory_lock($1, hashtext($2))', [RUN_LOCK_SPACE, runId]);
  } catch (err) {
    client.release(true);
    throw err;
  }
  let run: ExportRun;
  try {
    run = await ExportRun.create({ id: runId, organizationId: organization.id, userId: user.id, kind, fromDate: from, toDate: to });
  } catch (err) {
    client.release(true);
    throw err;
  }
  let rows = 0;
  let bytes = 0;
  let clientGone = false;
  res.on('close', () => {
    if (!res.writableFinished) clientGone = true;
  });

  const filename = exportFilename(kind, from, to);
  res.status(200);
  res.setHeader('Content-Type', CONTENT_TYPES[opts.format]);
  res.setHeader('Content-Disposition', contentDisposition(filename));
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Cache-Control', 'no-store');
  // The history row, so the screen can match a download to its history line.
  res.setHeader('X-Export-Run', run.id);

  let failure: unknown = null;
  try {
    await client.query('BEGIN ISOLATION LEVEL REPEATABLE READ READ ONLY');
    const counter = new Transform({
      transform(chunk: Buffer, _encoding, done) {
        bytes += chunk.length;
        done(null, chunk);
      },
    });
    // The response stays open after the last byte until the history row says finished, so a
    // screen that refreshes the history when its download ends reads the final answer.
    const delivered = pipeline(counter, res, { end: false });
    // A failure on either side destroys both pipelines; the other promise's rejection is the same failure.
    delivered.catch(() => {});
    await opts.write(
      { client, organizationId: organization.id, timeZone: organization.timeZone, currency: organization.currency, from, to, ...rangeInstants(from, to, organization.timeZone), count: () => void rows++ },
      counter,
    );
    await delivered;
    await client.query('COMMIT');
  } catch (err) {
    failure = err;
  }

  const aborted = clientGone || (failure !== null && res.destroyed && !res.writableFinished && isPrematureClose(failure));
  const status = failure === null && !clientGone ? 'ok' : aborted ? 'aborted' : 'failed';
  if (status === 'failed') logger.error({ err: failure, exportRunId: run.id, kind }, 'export failed');
  try {
    // The person may already have cancelled it from the screen (markCancelled): that stays.
    const [closed] = await ExportRun.update(
      { status, rowCount: rows, byteCount: bytes, finishedAt: new Date(), error: status === 'failed' ? 'The export stopped on a server error; the file is incomplete.' : null },
      { where: { id: run.id, status: 'running' } },
    );
    if (closed === 0) await ExportRun.update({ rowCount: rows, byteCount: bytes, finishedAt: new Date() }, { where: { id: run.id } });
  } finally {
    // The lock goes only once the row is closed. After a failure the connection is closed rather
    // than reused (a cursor may be half read on it), which lets the lock go too.
    if (failure === null) {
      await client.query('SELECT pg_advisory_unlock($1, hashtext($2))', [RUN_LOCK_SPACE, runId]).then(() => client.release(), (err: Error) => client.release(err));
    } else {
      client.release(true);
    }
  }
  if (status === 'failed' && !res.headersSent) {
    // Nothing was sent yet: the usual error answer can still go out.
    res.removeHeader('Content-Disposition');
    throw failure;
  }
  // Mid-stream, the only honest signal left is a cut connection: the browser reports a failed download.
  if (status === 'failed' && !res.destroyed) res.destroy();
  else if (!res.destroyed && !res.writableEnded) res.end();
}

/** The first key of every export run's advisory lock (the second is the hash of the run's id). */
const RUN_LOCK_SPACE = 0x4775_6578;

/**
 * A history row that says running while no process holds its lock belongs to a server that
 * stopped mid-export (a crash, a kill, a lost machine): it is closed as failed. Any process may
 * run this (the lock is PostgreSQL's, seen by all); the history does before it answers.
 */
export async function sweepStoppedRuns(organizationId: string): Promise<number> {
  const [, affected] = await sequelize.query(
    `UPDATE export_runs r
        SET status = 'failed', finished_at = now(), error = :error
      WHERE r.organization_id = :org AND r.status = 'running'
        AND NOT EXISTS (SELECT 1 FROM pg_locks l
                         WHERE l.locktype = 'advisory' AND l.database = (SELECT oid FROM pg_database WHERE datname = current_database())
                           AND l.classid = CAST(:space AS oid) AND l.objid = CAST(hashtext(CAST(r.id AS text)) AS oid) AND l.objsubid = 2)`,
    { replacements: { org: organizationId, space: RUN_LOCK_SPACE, error: 'The server stopped during this export; the file was not finished.' }, type: QueryTypes.UPDATE },
  );
  return affected as unknown as number;
}

function isPrematureClose(err: unknown) {
  const code = (err as { code?: string } | null)?.code;
  return code === 'ERR_STREAM_PREMATURE_CLOSE' || code === 'ECONNRESET' || code === 'EPIPE' || code === 'ERR_STREAM_DESTROYED';
}

/**
 * The screen's Cancel after the response began: the server may already have written the whole
 * file into the network's buffers and closed the run as finished, while the browser threw it
 * away. The person who ran it says so, and the history tells the truth: cancelled, nothing saved.
 * A failed run stays failed. Answers whether a run of this person's was found.
 */
export async function markCancelled(runId: string, user: User): Promise<boolean> {
  const run = await ExportRun.findOne({ where: { id: runId, organizationId: user.organizationId, userId: user.id } });
  if (!run) return false;
  if (run.status === 'running' || run.status === 'ok') {
    await ExportRun.update({ status: 'aborted', error: null }, { where: { id: run.id, status: ['running', 'ok'] } });
  }
  return true;
}
