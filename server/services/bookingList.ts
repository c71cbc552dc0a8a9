import { QueryTypes } from 'sequelize';
import type { BookingListQuery, BookingListRow, BookingStatus } from '../../shared/schemas/bookings';
import type { ListResponse } from '../../shared/schemas/common';
import { sequelize } from '../db';

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
 * storeTotal, commands/bookingTotals.ts); `withPrices` false leaves it out for the crew.
 */
export async function listBookings(organizationId: string, q: BookingListQuery, withPrices: boolean): Promise<ListResponse<BookingListRow>> {
  const where = ['b.organization_id = :organizationId'];
  if (q.status?.length) where.push('b.status IN (:status)');
  // from/to select events that overlap the range.
  if (q.to) where.push('b.event_start < :to');
  if (q.from) where.push('b.event_end > :from');
  if (q.customerId) where.push('b.customer_id = :customerId');
  if (q.q) where.push('(b.reference ILIKE :like OR c.name ILIKE :like OR b.site_city ILIKE :like)');
  const condition = where.join(' AND ');
  const replacements = {
    organizationId,
    status: q.status ?? null,
    to: q.to ? new Date(q.to) : null,
    from: q.from ? new Date(q.from) : null,
    customerId: q.customerId ?? null,
    like: q.q ? `%${q.q}%` : null,
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  };
  // The count joins the customer only when the search reads its name.
  const count = `SELECT count(*) FROM bookings b ${q.q ? 'JOIN customers c ON c.id = b.customer_id' : ''} WHERE ${condition}`;
  const rows = await sequelize.query<ListedRow>(
    `SELECT b.id, b.reference, b.status, b.event_start, b.event_end, b.site_line1, b.site_city, b.guest_count, b.currency, ${withPrices ? 'b.total_cents' : 'NULL AS total_cents'},
            c.id AS customer_id, c.name AS customer_name, (${count}) AS total
       FROM bookings b JOIN customers c ON c.id = b.customer_id
      WHERE ${condition}
      ORDER BY b.event_start, b.reference
      LIMIT :limit OFFSET :offset`,
    { replacements, type: QueryTypes.SELECT },
  );
  if (rows.length || !replacements.offset) return { data: rows.map((r) => presentListRow(r, withPrices)), total: Number(rows[0]?.total ?? 0) };
  // Past the last page no row carries the count: it is asked for alone.
  const [{ count: total }] = await sequelize.query<{ count: string }>(count, { replacements, type: QueryTypes.SELECT });
  return { data: [], total: Number(total) };
}

function presentListRow(r: ListedRow, withPrices: boolean): BookingListRow {
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
    totalCents: withPrices ? Number(r.total_cents) : null,
  };
}
