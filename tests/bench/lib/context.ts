import type pg from 'pg';
import type { BenchClient } from './http';

/** What every figure gets: the signed-in owner, a plain `pg` connection, the company and the app process. */
export interface BenchContext {
  http: BenchClient;
  db: pg.Client;
  organizationId: string;
  timeZone: string;
  /** The app's own process (its resident memory is read from /proc). */
  appPid: number;
  /** The client build the bundle figure reads (built with a manifest, away from dist/). */
  distDir: string;
  root: string;
}
