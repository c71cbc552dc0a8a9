/**
 * Figure 4: the bookkeeper's paid-invoices CSV over every season (about 40,000 invoices), through
 * GET /api/exports/paid-invoices.csv, against PostgreSQL's own `COPY (...) TO STDOUT WITH CSV` of
 * the same columns, written by hand. While the file downloads, the app's resident memory
 * (/proc/<pid>/status VmRSS) is sampled every 20 ms: the export streams, so it must not grow by
 * 64 MB or more.
 */
import fs from 'node:fs';
import { dateInZone } from '../../../shared/dates';
import type { BenchContext } from '../lib/context';
import { copyOut } from '../lib/copyOut';
import { compare, ms, times, type Result } from '../lib/measure';

const FROM = '2022-01-01';
const LIMIT_MB = 64;

function rssMb(pid: number): number {
  const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
  const kb = Number(/VmRSS:\s+(\d+)\s+kB/.exec(status)?.[1] ?? NaN);
  return kb / 1024;
}

const lit = (s: string) => `'${s.replace(/'/g, "''")}'`;

/** The export's columns: number, type, credited invoice, dates, customer, booking, revenue by account, discount, tax by rate, total, currency, how paid. */
function copySql(ctx: BenchContext, rates: string[], from: string, to: string) {
  const money = (expr: string) => `to_char((${expr}) / 100.0, 'FM999999999990.00')`;
  const org = lit(ctx.organizationId);
  const zone = lit(ctx.timeZone);
  return `COPY (
    WITH settled AS (
      SELECT a.invoice_id, max(p.received_at) AS paid_at,
             string_agg(initcap(p.method::text) || CASE WHEN p.reference <> '' THEN ' ' || p.reference ELSE '' END, '; ' ORDER BY p.received_at, p.id) AS how
        FROM payment_allocations a JOIN payments p ON p.id = a.payment_id
       WHERE a.organization_id = ${org}
       GROUP BY a.invoice_id)
    SELECT i.number, i.kind, cn.number, i.issue_date, to_char(s.paid_at AT TIME ZONE ${zone}, 'YYYY-MM-DD'), c.name, b.reference,
           ${money('i.rental_cents')}, ${money('i.delivery_labor_cents')}, ${money('i.damage_waiver_cents')}, ${money('i.damage_cents')}, '0.00',
           ${rates.map((r) => money(`CASE WHEN b.tax_rate_bp = ${Number(r)} THEN i.tax_cents ELSE 0 END`)).join(', ')},
           ${money('i.total_cents')}, b.currency, s.how
      FROM invoices i
      JOIN settled s ON s.invoice_id = i.id
      JOIN customers c ON c.id = i.customer_id
      JOIN bookings b ON b.id = i.booking_id
      LEFT JOIN invoices cn ON cn.id = i.credits_invoice_id
     WHERE i.organization_id = ${org} AND i.status = 'paid' AND i.number IS NOT NULL
       AND s.paid_at >= (${lit(from)}::date)::timestamp AT TIME ZONE ${zone}
       AND s.paid_at < ((${lit(to)}::date + 1)::timestamp AT TIME ZONE ${zone})
     ORDER BY s.paid_at, i.number
  ) TO STDOUT WITH CSV HEADER`;
}

export async function paidInvoicesCsvFigure(ctx: BenchContext): Promise<Result> {
  const to = dateInZone(new Date(), ctx.timeZone);
  const path = `/api/exports/paid-invoices.csv?from=${FROM}&to=${to}`;
  const base = { key: 'paid-invoices-csv', target: `≤ 2×, memory grows < ${LIMIT_MB} MB` };
  const probe = await ctx.http.request('GET', path);
  if (probe.status === 404) {
    return { ...base, figure: 'Paid-invoices CSV, every season', measured: 'missing (GET /api/exports/paid-invoices.csv answers 404)', pass: null };
  }
  if (probe.status !== 200) throw new Error(`GET ${path} answered ${probe.status}: ${probe.body.toString('utf8').slice(0, 300)}`);
  const rows = probe.body.toString('utf8').split('\r\n').filter(Boolean).length - 1;
  const rates = (await ctx.db.query<{ rate: string }>('SELECT DISTINCT tax_rate_bp::text AS rate FROM bookings WHERE organization_id = $1 ORDER BY 1', [ctx.organizationId])).rows.map((r) => r.rate);
  const sql = copySql(ctx, rates, FROM, to);
  const copied = await copyOut(ctx.db, sql);

  let growth = 0;
  let peakRss = 0;
  const download = async () => {
    const before = rssMb(ctx.appPid);
    let peak = before;
    const sampler = setInterval(() => (peak = Math.max(peak, rssMb(ctx.appPid))), 20);
    let bytes = 0;
    const reply = await ctx.http.request('GET', path, { onChunk: (c) => (bytes += c.length) });
    clearInterval(sampler);
    peak = Math.max(peak, rssMb(ctx.appPid));
    if (reply.status !== 200 || bytes === 0) throw new Error(`GET ${path} answered ${reply.status} with ${bytes} bytes.`);
    growth = Math.max(growth, peak - before);
    peakRss = Math.max(peakRss, peak);
  };
  const r = await compare(download, () => copyOut(ctx.db, sql), { warmup: 1, runs: 5 });
  return {
    ...base,
    figure: `Paid-invoices CSV, ${FROM} to ${to} (${rows.toLocaleString('en-US')} invoices, ${(probe.body.length / 1048576).toFixed(1)} MB)`,
    measured: `${ms(r.subject)} vs COPY ${ms(r.baseline)} = ${times(r.ratio)}; RSS +${growth.toFixed(1)} MB (peak ${peakRss.toFixed(0)} MB)`,
    pass: r.ratio <= 2 && growth < LIMIT_MB,
    notes: [
      `COPY: ${copied.lines - 1} rows, ${(copied.bytes / 1048576).toFixed(1)} MB`,
      `route runs (ms): ${r.subjectRuns.map((x) => x.toFixed(0)).join(' ')}`,
      `COPY runs (ms): ${r.baselineRuns.map((x) => x.toFixed(0)).join(' ')}`,
    ],
  };
}
