import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import Handlebars from 'handlebars';
import nodemailer from 'nodemailer';
import type { Transaction } from '../db';
import { env } from '../env';
import { queueJob } from './jobs';

const templatesDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', 'templates', 'emails');

export interface OutgoingMail {
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
export function renderMail(name: string, values: Record<string, unknown>): Omit<OutgoingMail, 'to'> {
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

/** Queues a templated e-mail to be sent by the mail job after the transaction commits. */
export async function queueMail(to: string, template: string, values: Record<string, unknown>, transaction?: Transaction) {
  const mail: OutgoingMail = { to, ...renderMail(template, values) };
  await queueJob('send-mail', mail, transaction);
}

let transport: nodemailer.Transporter | null = null;

export interface MailAttachment {
  filename: string;
  content: Buffer;
  contentType: string;
}

/** Sends over SMTP now; only the mail jobs call this. */
export async function deliverMail(mail: OutgoingMail & { attachments?: MailAttachment[]; replyTo?: string; fromName?: string }) {
  transport ??= nodemailer.createTransport({
    url: env.SMTP_URL,
    // The local sink does not offer STARTTLS (its built-in certificate has expired).
    ignoreTLS: env.SMTP_URL.startsWith('smtp://'),
  } as nodemailer.TransportOptions);
  const from = mail.fromName ? `"${mail.fromName.replace(/["\\]/g, '')} via Guyline" <${env.MAIL_FROM.replace(/^.*<|>.*$/g, '')}>` : env.MAIL_FROM;
  await transport.sendMail({
    from,
    to: mail.to,
    replyTo: mail.replyTo || undefined,
    subject: mail.subject,
    text: mail.text,
    html: mail.html,
    attachments: mail.attachments?.map((a) => ({ filename: a.filename, content: a.content, contentType: a.contentType })),
  });
}
