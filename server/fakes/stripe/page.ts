import { formatAmount } from './amounts';
import { TEST_CARDS, type CardField, type CardFieldError } from './cards';
import type { FakeCharge, SessionRecord } from './store';

/**
 * The fake's own pages: the test card page a payer fills in, the authentication step, the
 * finished and expired states, and a receipt. Plain HTML forms that work without scripts; every
 * field has a label, hints and errors are tied to their fields, and errors are announced.
 */

/** Text and double-quoted attribute values (the pages use no single-quoted attributes). */
export function escapeHtml(value: unknown): string {
  return String(value ?? '')
    .replaceAll('&', '&amp;')
    .replaceAll('<', '&lt;')
    .replaceAll('>', '&gt;')
    .replaceAll('"', '&quot;');
}

const STYLE = `
  :root { color-scheme: light; }
  * { box-sizing: border-box; }
  body { margin: 0; font: 16px/1.5 system-ui, -apple-system, "Segoe UI", Roboto, sans-serif; color: #1f2328; background: #f3f4f6; }
  main { max-width: 30rem; margin: 2rem auto; padding: 1.5rem; background: #fff; border: 1px solid #d1d5db; border-radius: 8px; }
  .banner { margin: 0 0 1rem; padding: .5rem .75rem; background: #fef3c7; border: 1px solid #b45309; border-radius: 6px; font-size: .875rem; }
  h1 { font-size: 1.375rem; line-height: 1.3; margin: 0 0 .75rem; }
  h2 { font-size: 1rem; margin: 0 0 .25rem; }
  table { width: 100%; border-collapse: collapse; margin: 0 0 1.25rem; font-size: .9375rem; }
  th, td { text-align: left; padding: .375rem 0; border-bottom: 1px solid #e5e7eb; vertical-align: top; }
  td.num, th.num { text-align: right; white-space: nowrap; }
  .field { margin: 0 0 1rem; }
  .row { display: flex; gap: 1rem; }
  .row .field { flex: 1; }
  label { display: block; font-weight: 600; }
  .hint { margin: 0; color: #4b5563; font-size: .875rem; }
  .error { margin: .125rem 0 0; color: #b42318; font-weight: 600; font-size: .875rem; }
  input { display: block; width: 100%; margin-top: .25rem; padding: .5rem .625rem; font: inherit; border: 1px solid #6b7280; border-radius: 6px; }
  input[aria-invalid="true"] { border: 2px solid #b42318; }
  input:focus, button:focus, a:focus { outline: 3px solid #2563eb; outline-offset: 2px; }
  .alert { margin: 0 0 1rem; padding: .75rem; border: 2px solid #b42318; border-radius: 6px; background: #fef2f2; }
  .alert ul { margin: .25rem 0 0; padding-left: 1.25rem; }
  .alert a { color: #b42318; }
  .actions { display: flex; gap: 1rem; align-items: center; flex-wrap: wrap; margin-top: 1.25rem; }
  button { font: inherit; font-weight: 600; padding: .625rem 1.25rem; border-radius: 6px; border: 1px solid #111827; background: #111827; color: #fff; cursor: pointer; }
  button.secondary { background: #fff; color: #111827; }
  a { color: #1d4ed8; }
  details { margin-top: 1.5rem; font-size: .875rem; }
  details ul { padding-left: 1.25rem; }
  .visually-hidden { position: absolute; width: 1px; height: 1px; margin: -1px; padding: 0; overflow: hidden; clip: rect(0 0 0 0); white-space: nowrap; border: 0; }
  @media (max-width: 30rem) {
    main { margin: 0; border: 0; border-radius: 0; }
    .row { display: block; }
  }
  code { font-family: ui-monospace, SFMono-Regular, Menlo, monospace; }
`;

function layout(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="robots" content="noindex">
<title>${escapeHtml(title)} – Test card page</title>
<style>${STYLE}</style>
</head>
<body>
<main>
<p class="banner">Test card page: a local stand-in for a card payment. No real card is charged, and real card numbers are refused.</p>
${body}
</main>
</body>
</html>`;
}

function amountOf(record: SessionRecord): string {
  return formatAmount(record.session.amount_total ?? 0, record.session.currency ?? 'usd');
}

/** "Deposit for booking 1024", "2 × Stakes", or "Frame tent and 3 more". */
export function paidFor(record: SessionRecord): string {
  const [first, ...rest] = record.lineItems;
  const name = first.quantity && first.quantity > 1 ? `${first.quantity} × ${first.description}` : String(first.description);
  return rest.length === 0 ? name : `${name} and ${rest.length} more`;
}

function lineTable(record: SessionRecord): string {
  const currency = record.session.currency ?? 'usd';
  const rows = record.lineItems
    .map(
      (li) =>
        `<tr><td>${escapeHtml(li.description)}</td><td class="num">${li.quantity}</td><td class="num">${escapeHtml(formatAmount(li.amount_total, currency))}</td></tr>`,
    )
    .join('\n');
  return `<table>
<caption class="hint" style="text-align:left">What this payment is for</caption>
<thead><tr><th scope="col">Item</th><th scope="col" class="num">Qty</th><th scope="col" class="num">Amount</th></tr></thead>
<tbody>
${rows}
</tbody>
<tfoot><tr><th scope="row" colspan="2">Total</th><td class="num"><strong>${escapeHtml(amountOf(record))}</strong></td></tr></tfoot>
</table>`;
}

/**
 * What the payer reads about a failed try. Card errors carry payer-facing messages already;
 * the authentication failure's API message is written for developers.
 */
export function payerMessage(error: { code?: string | null; message?: string | null }): string {
  if (error.code === 'payment_intent_authentication_failure') return "Your card's issuer could not confirm this payment.";
  return error.message ?? 'The payment did not go through.';
}

export interface PayFormState {
  values: { cardNumber?: string; expiry?: string; cvc?: string; email?: string };
  fieldErrors: CardFieldError[];
  /** A decline or failed authentication: the whole try failed, not one field. */
  formError: string | null;
}

function field(
  name: CardField | 'email',
  label: string,
  hint: string,
  value: string | undefined,
  error: string | undefined,
  attrs: string,
): string {
  const describedBy = [`${name}-hint`, error ? `${name}-error` : ''].filter(Boolean).join(' ');
  return `<div class="field">
<label for="${name}">${escapeHtml(label)}</label>
<p class="hint" id="${name}-hint">${escapeHtml(hint)}</p>
${error ? `<p class="error" id="${name}-error"><span class="visually-hidden">Error: </span>${escapeHtml(error)}</p>` : ''}
<input id="${name}" name="${name}" ${attrs} value="${escapeHtml(value ?? '')}" aria-describedby="${describedBy}"${error ? ' aria-invalid="true"' : ''}>
</div>`;
}

export function payPage(record: SessionRecord, state: PayFormState): string {
  const s = record.session;
  const amount = amountOf(record);
  const errorFor = (f: string) => state.fieldErrors.find((e) => e.field === f)?.message;
  const summary =
    state.fieldErrors.length > 0
      ? `<div class="alert" role="alert" tabindex="-1" id="problem"><h2>Check the card details</h2><ul>${state.fieldErrors
          .map((e) => `<li><a href="#${e.field}">${escapeHtml(e.message)}</a></li>`)
          .join('')}</ul></div>`
      : state.formError
        ? `<div class="alert" role="alert" tabindex="-1" id="problem"><h2>The payment did not go through</h2><p style="margin:0">${escapeHtml(state.formError)} Try another card${s.cancel_url ? ', or cancel' : ''}.</p></div>`
        : '';
  const cards = TEST_CARDS.map((c) => `<li><code>${c.number.replace(/(\d{4})(?=\d)/g, '$1 ')}</code>: ${escapeHtml(c.description)}</li>`).join('');
  const body = `
<h1>Pay ${escapeHtml(amount)} for ${escapeHtml(paidFor(record))}</h1>
${lineTable(record)}
${summary}
<form method="post" action="/pay/${escapeHtml(s.id)}" novalidate>
${
  s.customer_email
    ? `<p>Receipt to <strong>${escapeHtml(s.customer_email)}</strong></p>`
    : field('email', 'Email for the receipt (optional)', 'We send the receipt here.', state.values.email, undefined, 'type="email" autocomplete="email"')
}
${field('cardNumber', 'Card number', 'Spaces are fine.', state.values.cardNumber, errorFor('cardNumber'), 'type="text" inputmode="numeric" autocomplete="cc-number" required')}
<div class="row">
${field('expiry', 'Expiry date', 'MM/YY, for example 04/30', state.values.expiry, errorFor('expiry'), 'type="text" inputmode="numeric" autocomplete="cc-exp" required')}
${field('cvc', 'Security code', '3 digits (4 for American Express)', state.values.cvc, errorFor('cvc'), 'type="text" inputmode="numeric" autocomplete="cc-csc" required')}
</div>
<div class="actions">
<button type="submit">Pay ${escapeHtml(amount)}</button>
${s.cancel_url ? `<a href="${escapeHtml(s.cancel_url)}">Cancel</a>` : ''}
</div>
</form>
<details>
<summary>Test card numbers</summary>
<p class="hint">Any future expiry date and any security code work. Each number behaves as the card processor's testing documentation describes.</p>
<ul>${cards}</ul>
</details>`;
  return layout(`Pay ${amount}`, body);
}

export function authenticatePage(pi: { id: string; amount: number; currency: string }, what: string | null): string {
  const amount = formatAmount(pi.amount, pi.currency);
  return layout(
    'Confirm this payment',
    `
<h1>Confirm the payment of ${escapeHtml(amount)}${what ? ` for ${escapeHtml(what)}` : ''}</h1>
<p>The card's issuer asks you to confirm this payment. This page stands in for the issuer's own check: choose how it ends.</p>
<form method="post" action="/authenticate/${escapeHtml(pi.id)}">
<div class="actions">
<button type="submit" name="result" value="complete">Complete</button>
<button type="submit" name="result" value="fail" class="secondary">Fail</button>
</div>
</form>`,
  );
}

export function statusPage(o: { title: string; message: string; link?: { href: string; text: string } | null }): string {
  return layout(
    o.title,
    `
<h1>${escapeHtml(o.title)}</h1>
<p>${escapeHtml(o.message)}</p>
${o.link ? `<p><a href="${escapeHtml(o.link.href)}">${escapeHtml(o.link.text)}</a></p>` : ''}`,
  );
}

export function sessionStatusPage(record: SessionRecord): string {
  const s = record.session;
  const amount = amountOf(record);
  if (s.status === 'complete') {
    return statusPage({
      title: 'Payment complete',
      message: `The payment of ${amount} for ${paidFor(record)} is complete. You can close this page.`,
      link: s.success_url ? { href: s.success_url.replaceAll('{CHECKOUT_SESSION_ID}', s.id), text: 'Continue' } : null,
    });
  }
  return statusPage({
    title: 'This payment page has expired',
    message: `The payment of ${amount} for ${paidFor(record)} can no longer be made here. Ask for a new payment link.`,
    link: s.cancel_url ? { href: s.cancel_url, text: 'Go back' } : null,
  });
}

export function receiptPage(charge: FakeCharge): string {
  const card = charge.payment_method_details.card;
  const refunded = charge.amount_refunded > 0 ? `<p>Refunded: ${escapeHtml(formatAmount(charge.amount_refunded, charge.currency))}</p>` : '';
  return layout(
    'Receipt',
    `
<h1>Receipt for ${escapeHtml(formatAmount(charge.amount, charge.currency))}</h1>
<p>Paid ${escapeHtml(new Date(charge.created * 1000).toISOString().slice(0, 10))} with ${escapeHtml(card.brand)} ending ${escapeHtml(card.last4)}.</p>
${refunded}
<p class="hint">Charge ${escapeHtml(charge.id)}${charge.description ? `, ${escapeHtml(charge.description)}` : ''}</p>`,
  );
}
