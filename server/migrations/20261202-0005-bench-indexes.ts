import type { QueryInterface } from 'sequelize';

/**
 * Indexes that `npm run bench` showed missing on a company with five seasons of data.
 *
 * - Bookings whose event overlaps a range (the Bookings screen's month, `event_start < to AND
 *   event_end > from`): one index led by each end. A recent month is found from its end
 *   (event_end > from is selective), an old month from its start, and the other bound is checked
 *   inside the index, so the page of 50 is sorted from a few hundred rows, never the whole table.
 *   Without them each request read all 20,000 bookings twice (the count and the page).
 * - The invoices list (newest first): without an index on (organization, created_at), every page
 *   sorted all 40,000 invoices, wide rows with their lines.
 * - Bookings by customer: the customers list counts each customer's bookings, and the customer's
 *   page, statement and portal find them; customer_id had no index.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query('CREATE INDEX bookings_org_event_start_end ON bookings (organization_id, event_start, event_end)');
  await qi.sequelize.query('CREATE INDEX bookings_org_event_end_start ON bookings (organization_id, event_end, event_start)');
  await qi.sequelize.query('CREATE INDEX invoices_org_created_at ON invoices (organization_id, created_at DESC, id)');
  await qi.sequelize.query('CREATE INDEX bookings_customer_id ON bookings (customer_id)');
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query('DROP INDEX IF EXISTS bookings_customer_id');
  await qi.sequelize.query('DROP INDEX IF EXISTS invoices_org_created_at');
  await qi.sequelize.query('DROP INDEX IF EXISTS bookings_org_event_end_start');
  await qi.sequelize.query('DROP INDEX IF EXISTS bookings_org_event_start_end');
}
