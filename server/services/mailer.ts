import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import Handlebars from 'handlebars';
import nodemailer from 'nodemailer';
import { QueryTypes } from 'sequelize';
import { sequelize, type Transaction } from '../db';
import { env } from '../env';
import { queueJob } from './jobs';

/** The header the local mail sink files a message under (server/fakes/mailSink.ts reads it). */
export const ORGANIZATION_HEADER = 'X-Guyline-Organization';

const templatesDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', 'templates', 'emails');

export interface OutgoingMail {
  /**
   * The company the mail is sent for: the demo's caught-mail screen shows each company its own.
   * Null only before a company exists (a sign-up's confirmation link).
   */
  organizationId: string | null;
  to: string;
  subject: string;
  text: string;
  html: string;
}

const compiled = new Map<string, HandlebarsTemplateDelegate>();

function escapeHtml(s: string) {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** Plain text to simple HTML: paragraphs, line breaks and clickable links. */
function textToHtml(text: string) {
  const paragraphs = text.trim().split(/\n{2,}/).map((p) =>
    escapeHtml(p)
      .replace(/(https?:\/\/[^\s<]+)/g, '<a href="$1">$1</a>')
      .replace(/\n/g, '<br>'),
  );
  return `<!doctype html><html><body style="font-family:sans-serif;line-height:1.5;color:#1f2a24">${paragraphs
    .map((p) => `<p>${p}</p>`)
    .join('\n')}</body></html>`;
}

/**
 * Renders templates/emails/<name>.hbs: the first line is `Subject: ...`, the rest the body.
 * Both are Handlebars over the given values.
 */
export function renderMail(name: string, values: Record<string, unknown>): Omit<OutgoingMail, 'to' | 'organizationId'> {
  let template = compiled.get(name);
  if (!template) {
    const source = fs.readFileSync(path.join(templatesDir, `${name}.hbs`), 'utf8');
    template = Handlebars.compile(source, { strict: true, noEscape: true });
    compiled.set(name, template);
  }
  const out = template(values);
  const [first, ...rest] = out.split('\n');
  if (!first.startsWith('Subject:')) throw new Error(`Mail template ${name} must start with a Subject: line`);
  const text = rest.join('\n').trim() + '\n';
  return { subject: first.slice('Subject:'.length).trim(), text, html: textToHtml(text) };
}

/**
 * Queues a templated e-mail, sent for `organizationId`, to go out by the mail job after the
 * transaction commits; returns the job's id. `null` is for mail sent before any company exists.
 */
export async function queueMail(organizationId: string | null, to: string, template: string, values: Record<string, unknown>, transaction?: Transaction) {
  const mail: OutgoingMail = { organizationId, to, ...renderMail(template, values) };
  return queueJob('send-mail', mail, transaction);
}

let transport: nodemailer.Transporter | null = null;

export interface MailAttachment {
  filename: string;
  content: Buffer;
  contentType: string;
}

export type MailToDeliver = OutgoingMail & { attachments?: MailAttachment[]; replyTo?: string; fromName?: string };

/** Sends over SMTP now, with the given Message-ID when there is one; deliverOnce is the way in for jobs. */
export async function deliverMail(mail: MailToDeliver & { messageId?: string }) {
  transport ??= nodemailer.createTransport({
    url: env.SMTP_URL,
    // The local sink does not offer STARTTLS (its built-in certificate has expired).
    ignoreTLS: env.SMTP_URL.startsWith('smtp://'),
    // Well inside a job's time limit (JOB_TIMEOUT_SECONDS): a hung SMTP server fails the attempt
    // before pg-boss gives the job to another worker, so two workers never send the same job at once.
    connectionTimeout: 30_000,
    greetingTimeout: 30_000,
    socketTimeout: 60_000,
  } as nodemailer.TransportOptions);
  const from = mail.fromName ? `"${mail.fromName.replace(/["\\]/g, '')} via Guyline" <${env.MAIL_FROM.replace(/^.*<|>.*$/g, '')}>` : env.MAIL_FROM;
  await transport.sendMail({
    from,
    to: mail.to,
    replyTo: mail.replyTo || undefined,
    subject: mail.subject,
    text: mail.text,
    html: mail.html,
    messageId: mail.messageId,
    attachments: mail.attachments?.map((a) => ({ filename: a.filename, content: a.content, contentType: a.contentType })),
    // Only for the local sink, which files each message under its company; real mail never carries it.
    headers: env.FAKES === 'on' && mail.organizationId ? { [ORGANIZATION_HEADER]: mail.organizationId } : undefined,
  });
}

/** The Message-ID of the mail sent for a key: the same on every attempt, so a repeat is recognisably the same message. */
export function messageIdFor(key: string) {
  const domain = env.MAIL_FROM.replace(/^.*@|>.*$/g, '') || 'guyline.invalid';
  return `<${createHash('sha256').update(key).digest('hex').slice(0, 32)}@${domain}>`;
}

/**
 * Sends the mail for `key` (a mail job's id, a document send's id) unless it already went out.
 *
 * pg-boss hands a job out at least once: a worker that dies mid-job (a crash, a SIGKILL, a lost
 * database) leaves the job active, and after its time limit another worker runs it again. So
 * each key has a `mail_deliveries` row: marked `sending` before the SMTP conversation and `sent`
 * as soon as the server accepts the message. A repeat that finds `sent` sends nothing.
 *
 * Exactly once is not possible over SMTP: the server takes the message when it answers 250 to
 * the final dot, and the worker can die after that answer and before it writes `sent`. A repeat
 * then finds `sending`, cannot know whether the server took the message, and sends it again
 * (at least once, never lost): the copy carries the same Message-ID, which mail stores and
 * clients use to recognise a repeat, and the row counts the attempt in `interrupted`. That window
 * is one database round trip after each accepted message; outside it nothing is sent twice.
 * A definite refusal from the server (a reply code) marks the row `failed`; the job's retry sends
 * again. Anything without a reply (a dropped connection) stays `sending`: the outcome is unknown.
 */
export async function deliverOnce(key: string, mail: MailToDeliver): Promise<'sent' | 'already_sent'> {
  const claimed = await sequelize.query<{ message_id: string }>(
    `INSERT INTO mail_deliveries (key, message_id, status) VALUES (:key, :messageId, 'sending')
     ON CONFLICT (key) DO UPDATE SET
       status = 'sending',
       attempts = mail_deliveries.attempts + 1,
       interrupted = mail_deliveries.interrupted + CASE WHEN mail_deliveries.status = 'sending' THEN 1 ELSE 0 END,
       error = NULL,
       started_at = now()
     WHERE mail_deliveries.status <> 'sent'
     RETURNING message_id`,
    { replacements: { key, messageId: messageIdFor(key) }, type: QueryTypes.SELECT },
  );
  if (claimed.length === 0) return 'already_sent';
  try {
    await deliverMail({ ...mail, messageId: claimed[0].message_id });
  } catch (err) {
    const e = err as Error & { responseCode?: number };
    await sequelize.query(`UPDATE mail_deliveries SET status = :status, error = :error WHERE key = :key`, {
      replacements: { key, status: e.responseCode ? 'failed' : 'sending', error: String(e.message).slice(0, 500) },
    });
    throw err;
  }
  await sequelize.query(`UPDATE mail_deliveries SET status = 'sent', sent_at = now() WHERE key = :key`, { replacements: { key } });
  return 'sent';
}
