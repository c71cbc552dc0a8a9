import type { BookingListQuery, BookingListRow, BookingStatus } from '../../shared/schemas/bookings';
import type { ListResponse } from '../../shared/schemas/common';
import { preparedQuery } from '../db';

interface ListedRow {
  total: string;
  id: string;
  reference: string;
  status: BookingStatus;
  event_start: Date;
  event_end: Date;
  site_line1: string;
  site_city: string;
  guest_count: number;
  currency: string;
  total_cents: string;
  customer_id: string;
  customer_name: string;
}

/**
 * The company's bookings as list rows: the page and the count in one query, no lines and no quote.
 * The total is bookings.total_cents, which every write that changes a quote keeps (commands/bookings.ts
 * storeTotal, commands/bookingTotals.ts); `withoutPrices` takes it out for the crew.
 *
 * The query runs as a named prepared statement (one per combination of filters) on a connection
 * of Sequelize's pool: PostgreSQL plans it once per connection instead of on every request, which
 * took as long as running it (npm run bench, bookings list). Values go as parameters, never into the text.
 */
export async function listBookings(organizationId: string, q: BookingListQuery): Promise<ListResponse<BookingListRow>> {
  const values: unknown[] = [organizationId];
  const param = (v: unknown) => {
    values.push(v);
    return `$${values.length}`;
  };
  const where = ['b.organization_id = $1'];
  const shape: string[] = [];
  if (q.status?.length) {
    where.push(`b.status::text = ANY(${param(q.status)}::text[])`);
    shape.push('s');
  }
  // from/to select events that overlap the range.
  if (q.to) {
    where.push(`b.event_start < ${param(new Date(q.to))}`);
    shape.push('t');
  }
  if (q.from) {
    where.push(`b.event_end > ${param(new Date(q.from))}`);
    shape.push('f');
  }
  if (q.customerId) {
    where.push(`b.customer_id = ${param(q.customerId)}`);
    shape.push('c');
  }
  if (q.q) {
    const like = param(`%${q.q.replace(/[\\%_]/g, (ch) => `\\${ch}`)}%`);
    where.push(`(b.reference ILIKE ${like} OR c.name ILIKE ${like} OR b.site_city ILIKE ${like})`);
    shape.push('q');
  }
  const condition = where.join(' AND ');
  // The count joins the customer only when the search reads its name.
  const count = `SELECT count(*) FROM bookings b ${q.q ? 'JOIN customers c ON c.id = b.customer_id' : ''} WHERE ${condition}`;
  const filters = values.length;
  const limit = param(q.pageSize);
  const offset = param((q.page - 1) * q.pageSize);
  const rows = await preparedQuery<ListedRow>(
    `bookings-list-${shape.join('') || 'all'}`,
    `SELECT b.id, b.reference, b.status, b.event_start, b.event_end, b.site_line1, b.site_city, b.guest_count, b.currency, b.total_cents,
            c.id AS customer_id, c.name AS customer_name, (${count}) AS total
       FROM bookings b JOIN customers c ON c.id = b.customer_id
      WHERE ${condition}
      ORDER BY b.event_start, b.reference
      LIMIT ${limit} OFFSET ${offset}`,
    values,
  );
  if (rows.length || q.page === 1) return { data: rows.map(presentListRow), total: Number(rows[0]?.total ?? 0) };
  // Past the last page no row carries the count: it is asked for alone.
  const [{ count: total }] = await preparedQuery<{ count: string }>(`bookings-count-${shape.join('') || 'all'}`, count, values.slice(0, filters));
  return { data: [], total: Number(total) };
}

/** The same page for someone who may not see prices (the crew): no totals. */
export function withoutPrices(page: ListResponse<BookingListRow>): ListResponse<BookingListRow> {
  return { ...page, data: page.data.map((r) => ({ ...r, totalCents: null })) };
}

function presentListRow(r: ListedRow): BookingListRow {
  return {
    id: r.id,
    reference: r.reference,
    status: r.status,
    customer: { id: r.customer_id, name: r.customer_name },
    eventStart: r.event_start.toISOString(),
    eventEnd: r.event_end.toISOString(),
    siteLine1: r.site_line1,
    siteCity: r.site_city,
    guestCount: r.guest_count,
    currency: r.currency,
    totalCents: Number(r.total_cents),
  };
}
