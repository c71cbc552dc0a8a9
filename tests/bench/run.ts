/**
 * `tsx tests/bench/run.ts`: runs the figures against the app the bench started (BENCH_URL, its
 * process APP_PID) and the database (DATABASE_URL), and writes the results as JSON to
 * BENCH_RESULTS. BENCH_ONLY=key,key runs some figures only (while working on one).
 */
import fs from 'node:fs';
import pg from 'pg';
import { sequelize } from '../../server/db';
import { BENCH_COMPANY, GENERATED_ACTION } from './company';
import { agreementPdfFigure } from './figures/agreementPdf';
import { availabilityFigure } from './figures/availability';
import { bookingsListFigure } from './figures/bookingsList';
import { clientBundleFigure } from './figures/clientBundle';
import { loadFigures } from './figures/load';
import { paidInvoicesCsvFigure } from './figures/paidInvoicesCsv';
import type { BenchContext } from './lib/context';
import { BenchClient } from './lib/http';
import type { Result } from './lib/measure';

const need = (name: string) => {
  const v = process.env[name];
  if (!v) throw new Error(`${name} is not set.`);
  return v;
};

const FIGURES: [string, string, (ctx: BenchContext) => Promise<Result | Result[]>][] = [
  ['bookings-list', 'Bookings list', bookingsListFigure],
  ['availability', 'Availability', availabilityFigure],
  ['agreement-pdf', 'Rental agreement PDF', agreementPdfFigure],
  ['paid-invoices-csv', 'Paid-invoices CSV', paidInvoicesCsvFigure],
  ['client-bundle', 'Client bundle', clientBundleFigure],
  ['load', 'Load', loadFigures],
];

const only = process.env.BENCH_ONLY?.split(',').filter(Boolean);
const db = new pg.Client({ connectionString: need('DATABASE_URL'), application_name: 'guyline-bench' });
await db.connect();
const org = await db.query<{ id: string; time_zone: string }>('SELECT id, time_zone FROM organizations WHERE name = $1', [BENCH_COMPANY.name]);
if (!org.rowCount) throw new Error('The benchmark company is not in the database.');
const generated = await db.query<{ data: { seconds: number; at: string; counts: Record<string, number> } }>(
  'SELECT data FROM audit_logs WHERE organization_id = $1 AND action = $2 ORDER BY created_at DESC LIMIT 1',
  [org.rows[0].id, GENERATED_ACTION],
);
const http = new BenchClient(need('BENCH_URL'));
await http.signIn(BENCH_COMPANY.ownerEmail, BENCH_COMPANY.password);
const ctx: BenchContext = {
  http, db, organizationId: org.rows[0].id, timeZone: org.rows[0].time_zone, appPid: Number(need('APP_PID')), distDir: need('BENCH_DIST'), root: process.cwd(),
};

const results: Result[] = [];
for (const [key, name, run] of FIGURES) {
  if (only && !only.includes(key)) continue;
  process.stdout.write(`[bench] ${name}...\n`);
  try {
    const r = await run(ctx);
    for (const one of Array.isArray(r) ? r : [r]) {
      results.push(one);
      process.stdout.write(`[bench]   ${one.pass === null ? 'MISSING' : one.pass ? 'pass' : 'FAIL'}  ${one.figure}: ${one.measured}\n`);
      for (const note of one.notes ?? []) process.stdout.write(`[bench]       ${note}\n`);
    }
  } catch (err) {
    const message = (err as Error).message;
    results.push({ key, figure: name, measured: `error: ${message}`, target: '', pass: false });
    process.stdout.write(`[bench]   FAIL  ${name}: ${(err as Error).stack ?? message}\n`);
  }
}

const pgVersion = (await db.query<{ server_version: string }>('SHOW server_version')).rows[0].server_version;
fs.writeFileSync(need('BENCH_RESULTS'), JSON.stringify({ results, pgVersion, generated: generated.rows[0]?.data ?? null }, null, 2));
http.close();
await db.end();
await sequelize.close();
