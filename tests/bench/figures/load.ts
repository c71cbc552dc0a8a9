/**
 * Figure 6: load. autocannon, 50 connections for 30 s on each of the main read routes, signed in
 * as the owner with the one session cookie: the bookings list (the Bookings screen, this month),
 * the invoices list, the customers list, one booking, and Home (who is signed in, the company and
 * today's figures, the three calls the Home screen makes). No request
 * may fail or answer other than 2xx, and the 99th percentile stays within 10x the median.
 */
import autocannon from 'autocannon';
import type { BenchContext } from '../lib/context';
import type { Result } from '../lib/measure';
import { BUSY_MONTH, monthRange } from './bookingsList';

const CONNECTIONS = 50;
const SECONDS = Number(process.env.BENCH_LOAD_SECONDS ?? 30);

export async function loadFigures(ctx: BenchContext): Promise<Result[]> {
  const { from, to } = monthRange(BUSY_MONTH, ctx.timeZone);
  // A booking of the busiest month with many lines: the page the office opens most.
  const booking = (
    await ctx.db.query<{ id: string; reference: string }>(
      `SELECT b.id, b.reference FROM bookings b JOIN booking_lines l ON l.booking_id = b.id
        WHERE b.organization_id = $1 AND b.event_start >= '2026-06-01' AND b.event_start < '2026-07-01'
        GROUP BY b.id ORDER BY count(*) DESC, b.reference LIMIT 1`,
      [ctx.organizationId],
    )
  ).rows[0];
  const routes: [key: string, name: string, paths: string[]][] = [
    ['bookings', `bookings list (${BUSY_MONTH})`, [`/api/bookings?from=${encodeURIComponent(from.toISOString())}&to=${encodeURIComponent(to.toISOString())}&page=1&pageSize=50`]],
    ['invoices', 'invoices list', ['/api/invoices?page=1&pageSize=50']],
    ['customers', 'customers list', ['/api/customers?page=1&pageSize=50']],
    ['booking', `a booking (${booking.reference})`, [`/api/bookings/${booking.id}`]],
    ['dashboard', 'Home (/api/auth/me, /api/organization, /api/dashboard)', ['/api/auth/me', '/api/organization', '/api/dashboard']],
  ];
  const results: Result[] = [];
  for (const [key, name, paths] of routes) {
    for (const path of paths) {
      const check = await ctx.http.request('GET', path);
      if (check.status !== 200) throw new Error(`GET ${path} answered ${check.status} before the load.`);
    }
    const r = await autocannon({
      url: ctx.http.base, connections: CONNECTIONS, duration: SECONDS, headers: { cookie: ctx.http.cookieHeader }, timeout: 10,
      requests: paths.map((path) => ({ method: 'GET', path })),
    });
    const failed = r.non2xx + r.errors + r.timeouts;
    const ratio = r.latency.p99 / Math.max(1, r.latency.p50);
    results.push({
      key: `load-${key}`,
      figure: `Load, ${CONNECTIONS} connections × ${SECONDS} s: GET ${name}`,
      measured: `${r.requests.total.toLocaleString('en-US')} requests (${Math.round(r.requests.average)}/s), p50 ${r.latency.p50} ms, p99 ${r.latency.p99} ms (${ratio.toFixed(1)}×), ${failed} failed`,
      target: '0 failed, p99 ≤ 10× p50',
      pass: failed === 0 && r.requests.total > 0 && r.latency.p99 <= 10 * Math.max(1, r.latency.p50),
      notes: [`${paths.join(', ')}: non-2xx ${r.non2xx}, errors ${r.errors}, timeouts ${r.timeouts}, max ${r.latency.max} ms`],
    });
  }
  return results;
}
