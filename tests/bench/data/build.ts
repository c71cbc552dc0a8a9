/**
 * Builds the benchmark company: the company and its people through the app's models, then the
 * stock, customers, bookings and money in bulk through `pg`. Journal entries go in, in the order
 * they happened, in transactions of a few thousand: the deferred triggers check at each commit
 * that every entry balances and give it its number.
 */
import { randomUUID } from 'node:crypto';
import pg from 'pg';
import { hashPassword } from '../../../server/commands/accounts';
import { bookingBreakdown } from '../../../server/commands/invoices';
import { sequelize, withTransaction } from '../../../server/db';
import { ensureChart, type SystemKey } from '../../../server/ledger/chart';
import { Account, Organization, User } from '../../../server/models';
import { seededRandom } from '../../../server/seed/demoBookings';
import { ensureCompanyCertificate } from '../../../server/services/companyCertificate';
import { rulesOf } from '../../../server/services/rules';
import type { Role } from '../../../shared/types';
import { BENCH_COMPANY, GENERATED_ACTION } from '../company';
import { benchBookings, BOOKING_COUNT, FIRST_SEASON, LINE_COUNT, type BenchBooking } from './bookings';
import { insertRows, type Column } from './bulk';
import { benchCatalog, ITEM_COUNT } from './catalog';
import { benchCustomers, CUSTOMER_COUNT } from './customers';
import { benchMoney, INVOICE_COUNT, PAYMENT_COUNT } from './money';

const STAFF: { email: string; name: string; role: Role }[] = [
  { email: BENCH_COMPANY.ownerEmail, name: 'Rowan Ashby', role: 'owner' },
  { email: 'office1@bench.test', name: 'Dell Marchetti', role: 'office' },
  { email: 'office2@bench.test', name: 'Ivy Calloway', role: 'office' },
  { email: 'books@bench.test', name: 'Oona Pryce', role: 'bookkeeper' },
  ...Array.from({ length: 6 }, (_, i) => ({ email: `crew${i + 1}@bench.test`, name: `Crew member ${i + 1}`, role: 'crew' as Role })),
];

const step = (t0: number, what: string) => console.log(`[bench]   ${what} (${((performance.now() - t0) / 1000).toFixed(1)} s)`);

async function createCompany() {
  const passwordHash = await hashPassword(BENCH_COMPANY.password);
  return withTransaction(async (t) => {
    const org = await Organization.create(
      {
        name: BENCH_COMPANY.name, addressLine1: '27 Larkspur Road', city: 'Alder Falls', region: 'Wrenfield County', postalCode: '00427', country: 'US',
        phone: '555-0177', email: 'office@larkspur-rentals.test', currency: 'USD', timeZone: BENCH_COMPANY.timeZone, rules: { taxRateBp: 725 },
      },
      { transaction: t },
    );
    await ensureCompanyCertificate(org.id, t);
    const users = [];
    for (const u of STAFF) users.push(await User.create({ organizationId: org.id, ...u, passwordHash, status: 'active' }, { transaction: t }));
    await ensureChart(org.id, t);
    const accounts = await Account.findAll({ where: { organizationId: org.id }, transaction: t });
    return { org, users, accounts: new Map(accounts.map((a) => [a.systemKey as SystemKey, a.id])) };
  });
}

export async function generate(url: string): Promise<number> {
  const t0 = performance.now();
  const rand = seededRandom(20221001);
  const newId = () => randomUUID();
  const now = new Date();
  console.log('[bench] Generating the benchmark company (five seasons of bookings and money)...');
  const { org, users, accounts } = await createCompany();
  const zone = org.timeZone;
  const staff = users.filter((u) => u.role === 'owner' || u.role === 'office').map((u) => u.id);

  const firstDay = new Date(Date.UTC(FIRST_SEASON, 0, 1));
  const items = benchCatalog(rand, newId);
  const customers = benchCustomers(rand, newId, firstDay);
  const bookings = benchBookings(rand, newId, { items, customers, zone, now });
  // A customer is on the books from a little before their first booking.
  const firstBooking = new Map<string, Date>();
  for (const b of bookings) if (!firstBooking.has(b.customer.id)) firstBooking.set(b.customer.id, b.createdAt);
  for (const c of customers) c.createdAt = new Date((firstBooking.get(c.id) ?? c.createdAt).getTime() - Math.floor(rand() * 30) * 86_400_000);
  const rules = rulesOf(org);
  const money = benchMoney(rand, newId, bookings, {
    zone, now, staff, prefix: rules.invoicePrefix, balanceDueDays: rules.balanceDueDays,
    breakdown: (b) => {
      const { quote, breakdown } = bookingBreakdown(b as unknown as Parameters<typeof bookingBreakdown>[0], org);
      return { depositCents: quote.depositCents, totalCents: quote.totalCents, parts: breakdown };
    },
  });
  step(t0, `planned ${items.length} items, ${customers.length} customers, ${bookings.length} bookings, ${money.invoices.length} invoices, ${money.payments.length} payments, ${money.entries.length} journal entries`);

  const client = new pg.Client({ connectionString: url, application_name: 'guyline-bench-generator' });
  await client.connect();
  try {
    const o = org.id;
    await client.query('BEGIN');
    await insertRows(client, 'items', cols('id uuid, organization_id uuid, name text, kind enum_items_kind, sku text, description text, quantity_owned int, rental_price_cents bigint, extra_day_price_cents bigint, replacement_value_cents bigint, purchase_cost_cents bigint, taxable boolean, active boolean, tent_type enum_items_tent_type, width_ft numeric, length_ft numeric, height_ft numeric, section_length_ft numeric, seats int, poles_per_setup int, stakes_per_setup int, ballast_per_setup_lbs int, service_type enum_items_service_type, created_at timestamptz, updated_at timestamptz'),
      items.map((i) => [i.id, o, i.name, i.kind, i.sku, i.description, i.quantityOwned, i.rentalPriceCents, i.extraDayPriceCents, i.replacementValueCents, i.purchaseCostCents, i.taxable, i.active, i.tentType, i.widthFt, i.lengthFt, i.heightFt, i.sectionLengthFt, i.seats, i.polesPerSetup, i.stakesPerSetup, i.ballastPerSetupLbs, i.serviceType, firstDay, firstDay]));
    await insertRows(client, 'customers', cols('id uuid, organization_id uuid, type enum_customers_type, name text, contact_name text, email text, phone text, billing_line1 text, billing_city text, billing_region text, billing_postal_code text, notes text, tax_exempt boolean, created_at timestamptz, updated_at timestamptz'),
      customers.map((c) => [c.id, o, c.type, c.name, c.contactName, c.email, c.phone, c.billingLine1, c.billingCity, c.billingRegion, c.billingPostalCode, c.notes, c.taxExempt, c.createdAt, c.createdAt]));
    await insertRows(client, 'bookings', cols('id uuid, organization_id uuid, reference text, status enum_bookings_status, customer_id uuid, event_start timestamptz, event_end timestamptz, delivery_start timestamptz, delivery_end timestamptz, pickup_start timestamptz, pickup_end timestamptz, site_line1 text, site_city text, site_region text, site_postal_code text, site_notes text, surface enum_bookings_surface, anchoring enum_bookings_anchoring, utility_locate_number text, utility_locate_date date, guest_count int, seating enum_bookings_seating, after_dark boolean, delivery_miles numeric, setup_labor_cents bigint, discount_bp int, discount_cents bigint, damage_waiver boolean, own_insurance boolean, tax_rate_bp numeric, security_deposit_cents bigint, currency text, notes text, total_cents bigint, created_at timestamptz, updated_at timestamptz'),
      bookings.map((b) => [b.id, o, b.reference, b.status, b.customer.id, b.eventStart, b.eventEnd, b.deliveryStart, b.deliveryEnd, b.pickupStart, b.pickupEnd, b.siteLine1, b.siteCity, b.siteRegion, b.sitePostalCode, b.siteNotes, b.surface, b.anchoring, b.utilityLocateNumber, b.utilityLocateDate, b.guestCount, b.seating, b.afterDark, b.deliveryMiles, b.setupLaborCents, b.discountBp, b.discountCents, b.damageWaiver, b.ownInsurance, b.taxRateBp, b.securityDepositCents, org.currency, b.notes, b.totalCents, b.createdAt, b.updatedAt]));
    await insertRows(client, 'booking_lines', cols('id uuid, organization_id uuid, booking_id uuid, position int, item_id uuid, description text, quantity int, unit_price_cents bigint, extra_days int, extra_day_price_cents bigint, discount_bp int, discount_cents bigint, taxable boolean, kind enum_booking_lines_kind, created_at timestamptz, updated_at timestamptz'),
      bookings.flatMap((b) => b.lines.map((l) => [l.id, o, b.id, l.position, l.itemId, l.description, l.quantity, l.unitPriceCents, l.extraDays, l.extraDayPriceCents, l.discountBp, l.discountCents, l.taxable, l.kind, b.createdAt, b.createdAt])));
    step(t0, 'stock, customers, bookings and lines inserted');
    await insertRows(client, 'invoices', cols('id uuid, organization_id uuid, booking_id uuid, customer_id uuid, kind enum_invoices_kind, number text, status enum_invoices_status, issue_date date, due_date date, lines jsonb, rental_cents bigint, delivery_labor_cents bigint, damage_waiver_cents bigint, damage_cents bigint, tax_cents bigint, total_cents bigint, paid_cents bigint, ledger_entry_id uuid, created_by_id uuid, created_at timestamptz, updated_at timestamptz'),
      money.invoices.map((i) => [i.id, o, i.booking.id, i.booking.customer.id, i.kind, i.number, i.status, i.issueDate, i.dueDate, JSON.stringify(i.lines), i.parts.rentalCents, i.parts.deliveryLaborCents, i.parts.damageWaiverCents, i.parts.damageCents, i.parts.taxCents, i.totalCents, i.paidCents, i.ledgerEntryId, i.createdById, new Date(i.issuedAt.getTime() - 300_000), i.updatedAt]));
    await insertRows(client, 'payments', cols('id uuid, organization_id uuid, booking_id uuid, customer_id uuid, method enum_payments_method, amount_cents bigint, reference text, received_at timestamptz, ledger_entry_id uuid, recorded_by_id uuid, created_at timestamptz'),
      money.payments.map((p) => [p.id, o, p.booking.id, p.booking.customer.id, p.method, p.amountCents, p.reference, p.receivedAt, p.ledgerEntryId, p.recordedById, p.receivedAt]));
    await insertRows(client, 'payment_allocations', cols('id uuid, organization_id uuid, payment_id uuid, invoice_id uuid, amount_cents bigint'),
      money.payments.flatMap((p) => p.allocations.map((a) => [a.id, o, p.id, a.invoiceId, a.amountCents])));
    await insertRows(client, 'security_deposit_moves', cols('id uuid, organization_id uuid, booking_id uuid, kind enum_security_deposit_moves_kind, amount_cents bigint, method enum_security_deposit_moves_method, reason text, ledger_entry_id uuid, created_by_id uuid, created_at timestamptz'),
      money.moves.map((m) => [m.id, o, m.booking.id, m.kind, m.amountCents, m.method, '', m.ledgerEntryId, m.createdById, m.at]));
    for (const [year, n] of money.counters) {
      await client.query(`INSERT INTO invoice_counters (organization_id, year, series, next_number) VALUES ($1, $2, $3, $4)`, [o, year, rules.invoicePrefix, n + 1]);
    }
    await client.query('UPDATE organizations SET next_booking_number = $2 WHERE id = $1', [o, 1001 + bookings.length]);
    await client.query('COMMIT');
    step(t0, 'invoices, payments, allocations and security deposits inserted');

    const entryCols = cols('id uuid, organization_id uuid, booking_id uuid, customer_id uuid, occurred_at timestamptz, kind text, memo text, source_type text, source_id uuid, created_by_id uuid, created_at timestamptz');
    const lineCols = cols('organization_id uuid, entry_id uuid, position smallint, account_id uuid, debit_cents bigint, credit_cents bigint, revenue_key text');
    const CHUNK = 2_000;
    for (let start = 0; start < money.entries.length; start += CHUNK) {
      const part = money.entries.slice(start, start + CHUNK);
      await client.query('BEGIN');
      await insertRows(client, 'journal_entries', entryCols, part.map((e) => [e.id, o, e.bookingId, e.customerId, e.occurredAt, e.kind, e.memo, e.sourceType, e.sourceId, e.createdById, e.occurredAt]), CHUNK);
      await insertRows(client, 'journal_lines', lineCols, part.flatMap((e) => e.lines.map((l, position) => [o, e.id, position, accounts.get(l.account)!, l.debitCents ?? 0, l.creditCents ?? 0, l.revenueKey ?? null])), 20_000);
      // The deferred triggers run here: every entry must balance, and each takes its number.
      await client.query('COMMIT');
    }
    step(t0, `${money.entries.length} journal entries with ${money.entries.reduce((n, e) => n + e.lines.length, 0)} lines posted`);

    const counts = await client.query<Record<string, string>>(
      `SELECT (SELECT count(*) FROM items WHERE organization_id = $1) AS items, (SELECT count(*) FROM customers WHERE organization_id = $1) AS customers,
              (SELECT count(*) FROM bookings WHERE organization_id = $1) AS bookings, (SELECT count(*) FROM booking_lines WHERE organization_id = $1) AS booking_lines,
              (SELECT count(*) FROM invoices WHERE organization_id = $1) AS invoices, (SELECT count(*) FROM payments WHERE organization_id = $1) AS payments,
              (SELECT count(*) FROM journal_entries WHERE organization_id = $1) AS journal_entries, (SELECT count(*) FROM journal_lines WHERE organization_id = $1) AS journal_lines`,
      [o],
    );
    const c = Object.fromEntries(Object.entries(counts.rows[0]).map(([k, v]) => [k, Number(v)]));
    const expected = { items: ITEM_COUNT, customers: CUSTOMER_COUNT, bookings: BOOKING_COUNT, booking_lines: LINE_COUNT, invoices: INVOICE_COUNT, payments: PAYMENT_COUNT };
    for (const [k, v] of Object.entries(expected)) if (c[k] !== v) throw new Error(`Generated ${c[k]} ${k}, not ${v}.`);
    await client.query('VACUUM ANALYZE');
    step(t0, 'vacuumed and analyzed');
    const seconds = (performance.now() - t0) / 1000;
    // Written last: its presence means the company is complete.
    await client.query(
      `INSERT INTO audit_logs (organization_id, action, subject_type, subject_id, data) VALUES ($1, $2, 'organization', $1, $3)`,
      [o, GENERATED_ACTION, JSON.stringify({ generatorVersion: BENCH_COMPANY.generatorVersion, seconds: Math.round(seconds * 10) / 10, counts: c, at: now.toISOString() })],
    );
    return seconds;
  } finally {
    await client.end();
    await sequelize.close();
  }
}

/** "name type, name type" -> columns. */
function cols(spec: string): Column[] {
  return spec.split(',').map((s) => s.trim().split(/\s+/) as Column);
}

export type { BenchBooking };
