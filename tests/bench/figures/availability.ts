/**
 * Figure 2: availability of a 30-line booking against the whole calendar: the availability
 * service (checkAvailability, what POST /api/availability/check and reserving call) for the 30
 * items held most often, over the window of the busiest reserved weekend, against one
 * hand-written aggregate query through `pg`. The service is timed in this process: the answer is
 * a few milliseconds, so the route's fixed cost per request (HTTP, the session's query), which the
 * bookings-list and load figures measure, would hide it; the route's own time is printed beside.
 * The service's SQL (caught from Sequelize's log) is EXPLAINed: it must use indexes, never a
 * sequential scan of booking_lines.
 */
import { HOLDING_STATUSES } from '../../../shared/schemas/bookings';
import { sequelize } from '../../../server/db';
import { Organization } from '../../../server/models';
import { checkAvailability } from '../../../server/services/availability';
import { rulesOf } from '../../../server/services/rules';
import type { BenchContext } from '../lib/context';
import { compare, ms, times, type Result } from '../lib/measure';

const AGGREGATE = `
  SELECT i.id, i.quantity_owned, coalesce(h.held, 0)::int AS held
    FROM items i
    LEFT JOIN (
      SELECT bl.item_id, sum(bl.quantity) AS held
        FROM bookings b JOIN booking_lines bl ON bl.booking_id = b.id
       WHERE b.organization_id = $1 AND b.status = ANY($4::enum_bookings_status[])
         AND b.delivery_start < $3 AND b.pickup_end > $2::timestamptz - make_interval(hours => $5)
         AND bl.item_id = ANY($6::uuid[])
       GROUP BY bl.item_id) h ON h.item_id = i.id
   WHERE i.organization_id = $1 AND i.id = ANY($6::uuid[])`;

interface PlanNode { 'Node Type': string; 'Relation Name'?: string; 'Index Name'?: string; Plans?: PlanNode[] }

function walk(node: PlanNode, out: PlanNode[] = []): PlanNode[] {
  out.push(node);
  for (const child of node.Plans ?? []) walk(child, out);
  return out;
}

/** The busiest window among holding bookings, and the 30 items held most often. */
async function request(ctx: BenchContext) {
  const busiest = await ctx.db.query<{ delivery_start: Date; pickup_end: Date; reference: string; n: string }>(
    `SELECT b.reference, b.delivery_start, b.pickup_end,
            (SELECT count(*) FROM bookings o WHERE o.organization_id = b.organization_id AND o.status = ANY($2::enum_bookings_status[])
                AND o.delivery_start < b.pickup_end AND o.pickup_end > b.delivery_start) AS n
       FROM bookings b WHERE b.organization_id = $1 AND b.status = ANY($2::enum_bookings_status[])
      ORDER BY n DESC, b.reference LIMIT 1`,
    [ctx.organizationId, HOLDING_STATUSES],
  );
  const items = await ctx.db.query<{ id: string; quantity: number }>(
    `SELECT bl.item_id AS id, greatest(1, round(avg(bl.quantity)))::int AS quantity, count(*) AS n
       FROM booking_lines bl JOIN bookings b ON b.id = bl.booking_id JOIN items i ON i.id = bl.item_id
      WHERE b.organization_id = $1 AND b.status = ANY($2::enum_bookings_status[]) AND i.kind <> 'service'
      GROUP BY bl.item_id ORDER BY n DESC, bl.item_id LIMIT 30`,
    [ctx.organizationId, HOLDING_STATUSES],
  );
  const w = busiest.rows[0];
  return { from: new Date(w.delivery_start), to: new Date(w.pickup_end), reference: w.reference, overlapping: Number(w.n), lines: items.rows.map((r) => ({ itemId: r.id, quantity: r.quantity })) };
}

/** The service's own SQL, as Sequelize sent it, then EXPLAINed. */
async function servicePlan(ctx: BenchContext, req: Awaited<ReturnType<typeof request>>, turnaround: number) {
  const seen: string[] = [];
  // Sequelize reads its logging option at each query: catch this one call's SQL, then put it back.
  const options = (sequelize as unknown as { options: { logging: unknown } }).options;
  const before = options.logging;
  options.logging = (sql: string) => void seen.push(sql);
  try {
    await checkAvailability(ctx.organizationId, req.lines, req.from, req.to, turnaround);
  } finally {
    options.logging = before;
  }
  const holds = seen.find((s) => s.includes('FROM booking_lines'));
  if (!holds) throw new Error('The availability service ran no query on booking_lines.');
  const sql = holds.replace(/^Executing \([^)]*\):\s*/, '');
  const { rows } = await ctx.db.query<{ 'QUERY PLAN': [{ Plan: PlanNode }] }>(`EXPLAIN (FORMAT JSON) ${sql}`);
  return walk(rows[0]['QUERY PLAN'][0].Plan);
}

export async function availabilityFigure(ctx: BenchContext): Promise<Result> {
  const req = await request(ctx);
  const organization = (await Organization.findByPk(ctx.organizationId))!;
  const turnaround = rulesOf(organization).turnaroundHours;
  const body = { from: req.from.toISOString(), to: req.to.toISOString(), lines: req.lines };
  const query = () => ctx.db.query(AGGREGATE, [ctx.organizationId, req.from, req.to, HOLDING_STATUSES, turnaround, req.lines.map((l) => l.itemId)]);

  const service = () => checkAvailability(ctx.organizationId, req.lines, req.from, req.to, turnaround);
  const route = async () => {
    const reply = await ctx.http.request('POST', '/api/availability/check', { json: body });
    if (reply.status !== 200) throw new Error(`POST /api/availability/check answered ${reply.status}: ${reply.body.toString('utf8').slice(0, 200)}`);
  };
  // The same answer both ways: what is free of each item.
  const answer = await service();
  const sql = await query();
  const held = new Map(sql.rows.map((r) => [r.id as string, Number(r.quantity_owned) - Number(r.held)]));
  const agrees = answer.length === sql.rows.length && answer.every((a) => held.has(a.itemId) && a.available >= Math.max(0, held.get(a.itemId)!));
  const r = await compare(service, query, { warmup: 10, runs: 51 });
  const viaRoute = await compare(route, query, { warmup: 5, runs: 21 });

  const nodes = await servicePlan(ctx, req, turnaround);
  const seqOnLines = nodes.some((n) => n['Node Type'] === 'Seq Scan' && n['Relation Name'] === 'booking_lines');
  const indexOnLines = nodes.some((n) => /Index/.test(n['Node Type']) && (n['Relation Name'] === 'booking_lines' || n['Index Name']?.startsWith('booking_lines')));
  const plan = nodes.map((n) => `${n['Node Type']}${n['Index Name'] ? ` ${n['Index Name']}` : n['Relation Name'] ? ` ${n['Relation Name']}` : ''}`).join(' > ');
  return {
    key: 'availability',
    figure: `Availability service, 30 lines over ${req.reference}'s window (${req.overlapping} holding bookings overlap)`,
    measured: `service ${ms(r.subject)} vs SQL ${ms(r.baseline)} = ${times(r.ratio)} (through the route ${ms(viaRoute.subject)}); booking_lines ${seqOnLines ? 'SEQ SCAN' : indexOnLines ? 'by index' : 'not read by index'}${agrees ? '' : ' (answers differ!)'}; plan: ${plan}`,
    target: '≤ 2×, index on booking_lines, no seq scan',
    pass: agrees && r.ratio <= 2 && !seqOnLines && indexOnLines,
    notes: [
      `service runs (ms): ${r.subjectRuns.map((x) => x.toFixed(1)).join(' ')}`,
      `SQL runs (ms): ${r.baselineRuns.map((x) => x.toFixed(1)).join(' ')}`,
      `route runs (ms): ${viaRoute.subjectRuns.map((x) => x.toFixed(1)).join(' ')}`,
    ],
  };
}
