import { createHash, randomUUID } from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { CaughtMail } from '../../shared/schemas/mail';

const MAX_MESSAGES = 500;

/**
 * The local stand-in for an e-mail provider: an SMTP server on loopback that keeps every message
 * it receives, and a small HTTP API (`GET /messages`, `DELETE /messages`) to read them back.
 */
export async function startMailSink(opts: { smtpPort: number; httpPort: number; host?: string }) {
  const host = opts.host ?? '127.0.0.1';
  const messages: CaughtMail[] = [];

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
          messages.unshift({
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
    if (req.url === '/messages' && req.method === 'GET') {
      res.writeHead(200, { 'content-type': 'application/json' });
      return res.end(JSON.stringify(messages));
    }
    if (req.url === '/messages' && req.method === 'DELETE') {
      messages.length = 0;
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
