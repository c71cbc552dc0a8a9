import { createHmac, timingSafeEqual } from 'node:crypto';
import { env } from '../env';

/**
 * The pay link in an invoice's e-mail: the invoice id and an HMAC of it under a key derived from
 * the app's secret, so the link needs no storage and cannot be made up for another invoice. It
 * opens only that invoice's pay page, and pays nothing once the invoice is settled or void.
 */
const key = () => createHmac('sha256', env.JWT_SECRET).update('guyline pay links v1').digest();
const mac = (invoiceId: string) => createHmac('sha256', key()).update(invoiceId).digest('base64url').slice(0, 32);

export function payLinkToken(invoiceId: string): string {
  return `${invoiceId}.${mac(invoiceId)}`;
}

export function payLinkUrl(invoiceId: string): string {
  return `${env.APP_URL}/pay/${payLinkToken(invoiceId)}`;
}

/** The invoice id the token stands for, or null for a made-up or altered token. */
export function invoiceOfPayLink(token: string): string | null {
  const m = /^([0-9a-f-]{36})\.([A-Za-z0-9_-]{32})$/.exec(token);
  if (!m) return null;
  const want = Buffer.from(mac(m[1]));
  const got = Buffer.from(m[2]);
  return want.length === got.length && timingSafeEqual(want, got) ? m[1] : null;
}
