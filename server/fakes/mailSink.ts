import { createHash, randomUUID, timingSafeEqual } from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { CaughtMail } from '../../shared/schemas/mail';

const MAX_MESSAGES = 500;

function tokenMatches(header: string | undefined, token: string) {
  const given = Buffer.from(header?.replace(/^Bearer\s+/i, '') ?? '');
  const expected = Buffer.from(token);
  return given.length === expected.length && timingSafeEqual(given, expected);
}

/** The header the app adds (only while the fakes run) naming the company a message was sent for. */
export const ORGANIZATION_HEADER = 'x-guyline-organization';

/** A caught message and the company it was sent for (kept out of what the API answers). */
export type SinkMessage = CaughtMail & { organizationId: string | null };

/**
 * The local stand-in for an e-mail provider: an SMTP server on loopback that keeps every message
 * it receives, and a small HTTP API (`GET /messages`, `DELETE /messages`) to read them back.
 *
 * Caught mail holds live sign-in, reset, signing and pay links, so the HTTP API answers only a
 * caller that shows the sink's token (`Authorization: Bearer <token>`), when one is set; the app
 * passes `?organization=<id>` so each company's owner reads only the mail sent for that company.
 */
export async function startMailSink(opts: { smtpPort: number; httpPort: number; host?: string; token?: string }) {
  const host = opts.host ?? '127.0.0.1';
  const messages: SinkMessage[] = [];

  const smtp = new SMTPServer({
    authOptional: true,
    // smtp-server's built-in certificate has expired; the sink speaks plain SMTP on loopback only.
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: 25 * 1024 * 1024,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((m) => {
          const to = (Array.isArray(m.to) ? m.to : m.to ? [m.to] : []).flatMap((a) => a.value.map((v) => v.address ?? ''));
          const org = m.headers.get(ORGANIZATION_HEADER);
          messages.unshift({
            organizationId: typeof org === 'string' && org ? org : null,
            id: randomUUID(),
            to,
            from: m.from?.text ?? '',
            subject: m.subject ?? '',
            text: m.text ?? '',
            html: typeof m.html === 'string' ? m.html : '',
            date: (m.date ?? new Date()).toISOString(),
            attachments: m.attachments.map((a) => ({
              filename: a.filename ?? 'attachment',
              contentType: a.contentType,
              size: a.size,
              sha256: createHash('sha256').update(a.content).digest('hex'),
            })),
          });
          messages.splice(MAX_MESSAGES);
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });

  const api = http.createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://sink.invalid');
    if (opts.token && !tokenMatches(req.headers.authorization, opts.token)) {
      res.writeHead(401, { 'content-type': 'application/json' });
      return res.end(JSON.stringify({ error: { code: 'unauthenticated', message: 'The mail sink needs its token.' } }));
    }
    // Without ?organization every message (the test harness); with it, that company's only.
    const organization = url.searchParams.get('organization');
    const wanted = (m: SinkMessage) => organization === null || m.organizationId === organization;
    if (url.pathname === '/messages' && req.method === 'GET') {
      res.writeHead(200, { 'content-type': 'application/json', 'cache-control': 'no-store' });
      return res.end(JSON.stringify(messages.filter(wanted).map(({ organizationId: _o, ...m }) => m)));
    }
    if (url.pathname === '/messages' && req.method === 'DELETE') {
      const keep = messages.filter((m) => !wanted(m));
      messages.length = 0;
      messages.push(...keep);
      res.writeHead(204);
      return res.end();
    }
    res.writeHead(404, { 'content-type': 'application/json' });
    res.end(JSON.stringify({ error: { code: 'not_found', message: 'Unknown mail sink route.' } }));
  });

  await new Promise<void>((resolve, reject) => {
    smtp.once('error', reject);
    smtp.listen(opts.smtpPort, host, () => resolve());
  });
  await new Promise<void>((resolve, reject) => {
    api.once('error', reject);
    api.listen(opts.httpPort, host, () => resolve());
  });
  const smtpPort = (smtp.server.address() as AddressInfo).port;
  const httpPort = (api.address() as AddressInfo).port;
  return {
    smtpUrl: `smtp://${host}:${smtpPort}`,
    httpUrl: `http://${host}:${httpPort}`,
    messages,
    async close() {
      await new Promise<void>((r) => smtp.close(() => r()));
      await new Promise<void>((r) => api.close(() => r()));
    },
  };
}
