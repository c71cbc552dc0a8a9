/**
 * `tsx tests/bench/generate.ts`: builds the benchmark company in DATABASE_URL when it is not
 * there yet (500 items, 8,000 customers, 20,000 bookings, 200,000 lines, 40,000 invoices, 60,000
 * payments and their ledger), in bulk SQL through `pg`. The company itself (organization, users,
 * signing certificate, chart of accounts) is made with the app's own models and helpers.
 *
 * Exit codes: 0 built or already there; 3 a half-built company is in the way (an interrupted
 * run): the bench drops the database and runs this again.
 */
import pg from 'pg';
import { BENCH_COMPANY, GENERATED_ACTION } from './company';

const url = process.env.DATABASE_URL;
if (!url) throw new Error('DATABASE_URL is not set.');

async function state(): Promise<'ready' | 'absent' | 'partial'> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const org = await client.query<{ id: string }>('SELECT id FROM organizations WHERE name = $1', [BENCH_COMPANY.name]);
    if (!org.rowCount) return 'absent';
    const mark = await client.query(
      `SELECT 1 FROM audit_logs WHERE organization_id = $1 AND action = $2 AND (data->>'generatorVersion')::int = $3`,
      [org.rows[0].id, GENERATED_ACTION, BENCH_COMPANY.generatorVersion],
    );
    return mark.rowCount ? 'ready' : 'partial';
  } finally {
    await client.end();
  }
}

const found = await state();
if (found === 'ready') {
  console.log('[bench] The benchmark company is already in the database; keeping it.');
  process.exit(0);
}
if (found === 'partial') {
  console.log('[bench] A half-built (or older) benchmark company is in the database.');
  process.exit(3);
}
const { generate } = await import('./data/build');
const seconds = await generate(url);
console.log(`[bench] Generated the benchmark company in ${seconds.toFixed(1)} s.`);
process.exit(0);
