import { createHmac, timingSafeEqual } from 'node:crypto';
import { env } from '../env';
import { HttpError } from '../errors';
import type { Invoice, Organization } from '../models';

/**
 * The pay link in an invoice's e-mail: `<invoice id>.<generation>.<end day>.<HMAC>`. The HMAC (under
 * a key derived from the app's secret) covers the rest, so a link cannot be made up, moved to
 * another invoice or given a later end. It opens only that invoice's pay page, and pays nothing
 * once the invoice is settled or void.
 *
 * It stops working on its end day, or as soon as the office withdraws the invoice's links: that
 * raises `invoices.pay_link_generation`, and a link of an older generation is refused. Nothing
 * else is stored per link, so a fresh one is simply made again (the invoice e-mail, the office's
 * invoice page).
 */

/**
 * How long a link works from when it is made. 60 days: two 30-day payment terms, so the link in
 * an invoice e-mail still works for the overdue reminder after a month's terms (common practice,
 * no published source). Every e-mail of the invoice carries a new link with its own 60 days.
 */
export const PAY_LINK_DAYS = 60;
const DAY_MS = 86_400_000;

const keyV1 = () => createHmac('sha256', env.JWT_SECRET).update('guyline pay links v1').digest();
const keyV2 = () => createHmac('sha256', env.JWT_SECRET).update('guyline pay links v2').digest();
const macOf = (key: Buffer, text: string) => createHmac('sha256', key).update(text).digest('base64url').slice(0, 32);

const sameMac = (want: string, got: string) => {
  const a = Buffer.from(want);
  const b = Buffer.from(got);
  return a.length === b.length && timingSafeEqual(a, b);
};

/** The end of a link made at `now`, in whole days (UTC), so the office's page shows one link a day, not a new one a second. */
const endDay = (now: Date) => Math.ceil((now.getTime() + PAY_LINK_DAYS * DAY_MS) / DAY_MS);

/** When a link made now stops working. */
export function payLinkEndsAt(now = new Date()): Date {
  return new Date(endDay(now) * DAY_MS);
}

export function payLinkToken(invoiceId: string, generation = 0, now = new Date()): string {
  const body = `${invoiceId}.${generation}.${endDay(now)}`;
  return `${body}.${macOf(keyV2(), body)}`;
}

export function payLinkUrl(invoiceId: string, generation = 0, now = new Date()): string {
  return `${env.APP_URL}/pay/${payLinkToken(invoiceId, generation, now)}`;
}

/** What a genuine link says; `endsAt` null is a link from before links had an end (`<id>.<HMAC>`). */
export interface PayLinkClaim {
  invoiceId: string;
  generation: number;
  endsAt: Date | null;
}

/** The claim of a genuine token, or null for a made-up or altered one. */
export function readPayLink(token: string): PayLinkClaim | null {
  const v2 = /^([0-9a-f-]{36})\.(\d{1,9})\.(\d{1,7})\.([A-Za-z0-9_-]{32})$/.exec(token);
  if (v2) {
    const body = `${v2[1]}.${v2[2]}.${v2[3]}`;
    return sameMac(macOf(keyV2(), body), v2[4]) ? { invoiceId: v2[1], generation: Number(v2[2]), endsAt: new Date(Number(v2[3]) * DAY_MS) } : null;
  }
  const v1 = /^([0-9a-f-]{36})\.([A-Za-z0-9_-]{32})$/.exec(token);
  if (v1) return sameMac(macOf(keyV1(), v1[1]), v1[2]) ? { invoiceId: v1[1], generation: 0, endsAt: null } : null;
  return null;
}

/**
 * Why a genuine link no longer opens its invoice, or null while it does. A link from before links
 * had an end was mailed when the invoice was issued or later, so it gets the same days counted from
 * the issue date: never longer than a new link would have had, and withdrawn like any other.
 */
export function payLinkEnded(claim: PayLinkClaim, invoice: Pick<Invoice, 'payLinkGeneration' | 'issueDate'>, now = new Date()): 'withdrawn' | 'expired' | null {
  if (claim.generation !== invoice.payLinkGeneration) return 'withdrawn';
  const endsAt = claim.endsAt ?? (invoice.issueDate ? new Date(Date.parse(`${invoice.issueDate}T00:00:00Z`) + (PAY_LINK_DAYS + 1) * DAY_MS) : new Date(0));
  return now.getTime() >= endsAt.getTime() ? 'expired' : null;
}

/** The 410 for an ended link: what happened, and that the company sends a new one (its contact beside, for the page). */
export function payLinkGone(reason: 'withdrawn' | 'expired', organization: Pick<Organization, 'name' | 'phone' | 'email'>) {
  const what =
    reason === 'withdrawn'
      ? `${organization.name} has withdrawn this pay link.`
      : `This pay link has expired: pay links work for ${PAY_LINK_DAYS} days.`;
  return new HttpError(
    410,
    'link_expired',
    `${what} Ask ${organization.name} to send you a new one, or sign in with your e-mail address to see what you owe and pay it there.`,
    undefined,
    { company: { name: organization.name, phone: organization.phone, email: organization.email } },
  );
}
