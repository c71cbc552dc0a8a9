import type PgBoss from 'pg-boss';
import { Op, QueryTypes } from 'sequelize';
import { addDays, dateInZone } from '../../shared/dates';
import { formatMoney } from '../../shared/money';
import { audit } from '../commands/audit';
import { sequelize, withTransaction, type Transaction } from '../db';
import { env } from '../env';
import { logger } from '../logger';
import { Booking, Customer, Invoice, Organization, SigningRequest } from '../models';
import { queueMail } from '../services/mailer';
import { rulesOf } from '../services/rules';

/** Claims a reminder; false when it already went out (the row's key makes it once only). */
async function claim(kind: string, subjectId: string, org: Organization, bookingId: string, to: string, t: Transaction) {
  const rows = await sequelize.query(
    `INSERT INTO reminders_sent (kind, subject_id, organization_id, booking_id, sent_to) VALUES (:kind, :subjectId, :org, :bookingId, :to)
     ON CONFLICT DO NOTHING RETURNING kind`,
    { replacements: { kind, subjectId, org: org.id, bookingId, to }, type: QueryTypes.SELECT, transaction: t },
  );
  return rows.length === 1;
}

async function remind(org: Organization, kind: string, subjectId: string, booking: Booking & { customer: Customer }, template: string, values: Record<string, unknown>) {
  const to = booking.customer.email;
  if (!to) return false;
  return withTransaction(async (t) => {
    if (!(await claim(kind, subjectId, org, booking.id, to, t))) return false;
    await queueMail(org.id, to, template, { customerName: booking.customer.name, companyName: org.name, companyPhone: org.phone || 'us', reference: booking.reference, ...values }, t);
    // The booking's history shows what went out.
    await audit({ organizationId: org.id, actorUserId: null, action: `reminder.${kind}`, subjectType: 'booking', subjectId: booking.id, data: { to, subjectId } }, null, t);
    return true;
  });
}

const longDate = (d: string) => new Intl.DateTimeFormat('en-US', { timeZone: 'UTC', dateStyle: 'long' }).format(new Date(`${d}T12:00:00Z`));

/** Sends the company's due reminders for `today` (YYYY-MM-DD in its zone); returns how many went out. */
export async function sendReminders(org: Organization, today: string) {
  const { reminders } = rulesOf(org);
  let sent = 0;
  const invoices = await Invoice.findAll({ where: { organizationId: org.id, status: { [Op.in]: ['open', 'partly_paid'] }, dueDate: { [Op.ne]: null } } });
  for (const inv of invoices) {
    const booking = (await Booking.findByPk(inv.bookingId, { include: [{ model: Customer, as: 'customer' }] })) as Booking & { customer: Customer };
    const owed = formatMoney(inv.totalCents - inv.paidCents, org.currency);
    const due = inv.dueDate!;
    if (reminders.balanceDue && due > today && due <= addDays(today, reminders.balanceDueDaysBefore)) {
      if (await remind(org, 'balance_due', inv.id, booking, 'reminder-balance-due', { number: inv.number, owed, due: longDate(due) })) sent++;
    }
    if (reminders.overdue && due < today) {
      if (await remind(org, 'overdue', inv.id, booking, 'reminder-overdue', { number: inv.number, owed, due: longDate(due) })) sent++;
    }
  }
  if (reminders.unsignedAgreement) {
    const olderThan = new Date(Date.now() - reminders.unsignedAfterDays * 86_400_000);
    const pending = await SigningRequest.findAll({ where: { organizationId: org.id, status: 'pending', createdAt: { [Op.lte]: olderThan }, expiresAt: { [Op.gt]: new Date() } } });
    for (const r of pending) {
      const booking = (await Booking.findByPk(r.bookingId, { include: [{ model: Customer, as: 'customer' }] })) as Booking & { customer: Customer };
      const expires = dateInZone(r.expiresAt, org.timeZone);
      // The link itself is not stored (only its hash): the reminder points to the first e-mail.
      if (await remind(org, 'unsigned_agreement', r.id, booking, 'reminder-unsigned', { expires: longDate(expires), sentTo: r.sentTo, appUrl: env.APP_URL })) sent++;
    }
  }
  return sent;
}

export async function registerReminders(boss: PgBoss) {
  await boss.schedule('send-reminders', '17 * * * *', {});
  await boss.work('send-reminders', { pollingIntervalSeconds: 5, batchSize: 1 }, async () => {
    for (const org of await Organization.findAll()) {
      const n = await sendReminders(org, dateInZone(new Date(), org.timeZone));
      if (n) logger.info({ organizationId: org.id, reminders: n }, 'reminders sent');
    }
  });
}
