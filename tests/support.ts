import { createRequire } from 'node:module';
import type { Express } from 'express';
import request from 'supertest';
import { inject } from 'vitest';
import { CSRF_COOKIE, CSRF_HEADER } from '../shared/types';
import type { CaughtMail } from '../shared/schemas/mail';

// superagent's cookie jar (the cookiejar package): `All` reads a cookie whatever its domain and path.
const { CookieAccessInfo } = createRequire(import.meta.url)('cookiejar') as { CookieAccessInfo: { All: unknown } };

let seq = 0;
/** A unique e-mail for this test run, so parallel tests never share accounts or mail. */
export function uniqueEmail(label = 'user') {
  seq += 1;
  return `${label}.${process.pid}.${Date.now().toString(36)}.${seq}@example.test`;
}

/** A unique client address (documentation range, sent as X-Forwarded-For) so rate limits never cross tests. */
export function uniqueIp() {
  seq += 1;
  return `2001:db8::${process.pid.toString(16)}:${seq.toString(16)}`;
}

/**
 * A browser-like API client over supertest: keeps cookies, and sends the CSRF header (read from
 * the `guyline_csrf` cookie) on every write, as the real client does.
 */
export class ApiClient {
  readonly agent: ReturnType<typeof request.agent>;
  ip: string;
  private csrfOverride: string | null = null;

  /**
   * The CSRF token to send: the `guyline_csrf` cookie the browser holds now (the server renews it
   * when a session starts, since the token is bound to the session), unless a test set its own.
   */
  get csrf(): string {
    if (this.csrfOverride !== null) return this.csrfOverride;
    const jar = (this.agent as unknown as { jar: { getCookie(name: string, access: unknown): { value: string } | undefined } }).jar;
    return jar.getCookie(CSRF_COOKIE, CookieAccessInfo.All)?.value ?? '';
  }
  set csrf(value: string) {
    this.csrfOverride = value;
  }

  /** `app` is an Express app in this process, or the URL of a running server (the demo's, for demo sign-ins). */
  constructor(app: Express | string, opts: { ip?: string } = {}) {
    this.agent = request.agent(app);
    this.ip = opts.ip ?? uniqueIp();
  }

  /** Responses' cookies go to the agent's jar; a renewed CSRF cookie replaces a token the test set. */
  private remember(res: request.Response) {
    const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
    if (cookies.some((c) => c.startsWith(`${CSRF_COOKIE}=`))) this.csrfOverride = null;
    return res;
  }

  async init() {
    this.remember(await this.agent.get('/api/health').set('X-Forwarded-For', this.ip));
    return this;
  }

  get(url: string) {
    return this.agent.get(url).set('X-Forwarded-For', this.ip).then((r) => this.remember(r));
  }

  private write(method: 'post' | 'patch' | 'put' | 'delete', url: string, body?: unknown, csrf = true) {
    let r = this.agent[method](url).set('X-Forwarded-For', this.ip);
    if (csrf && this.csrf) r = r.set(CSRF_HEADER, this.csrf);
    if (body !== undefined) r = r.send(body as object);
    return r.then((res) => this.remember(res));
  }

  post(url: string, body?: unknown, opts: { csrf?: boolean } = {}) {
    return this.write('post', url, body, opts.csrf ?? true);
  }
  put(url: string, body?: unknown, opts: { csrf?: boolean } = {}) {
    return this.write('put', url, body, opts.csrf ?? true);
  }
  patch(url: string, body?: unknown, opts: { csrf?: boolean } = {}) {
    return this.write('patch', url, body, opts.csrf ?? true);
  }
  delete(url: string, opts: { csrf?: boolean } = {}) {
    return this.write('delete', url, undefined, opts.csrf ?? true);
  }

  async login(email: string, password: string) {
    const res = await this.post('/api/auth/login', { email, password });
    if (res.status !== 200) throw new Error(`login ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
    return this;
  }
}

/** Everything the test run's mail sink caught, newest first (the harness reads all companies' mail). */
export async function allCaughtMail(): Promise<CaughtMail[]> {
  const r = await fetch(`${inject('mailSinkUrl')}/messages`, { headers: { authorization: `Bearer ${inject('mailSinkToken')}` } });
  if (!r.ok) throw new Error(`The mail sink answered ${r.status}`);
  return (await r.json()) as CaughtMail[];
}

/** Waits for the mail sink to catch a message to `to` (the app server's job worker sends it). */
export async function waitForMail(to: string, opts: { subject?: RegExp; timeoutMs?: number; count?: number } = {}): Promise<CaughtMail> {
  const until = Date.now() + (opts.timeoutMs ?? 20_000);
  while (Date.now() < until) {
    const all = await allCaughtMail();
    const mine = all.filter((m) => m.to.includes(to) && (!opts.subject || opts.subject.test(m.subject)));
    if (mine.length >= (opts.count ?? 1)) return mine[0];
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`No mail to ${to}${opts.subject ? ` matching ${opts.subject}` : ''} arrived in time`);
}

/** Every message the sink caught for one address, newest first. */
export async function mailTo(to: string): Promise<CaughtMail[]> {
  const all = await allCaughtMail();
  return all.filter((m) => m.to.includes(to));
}

export function linkToken(mail: CaughtMail, path: string): string {
  const m = mail.text.match(new RegExp(`${path}\\?token=([A-Za-z0-9_-]+)`));
  if (!m) throw new Error(`No ${path} link in mail "${mail.subject}"`);
  return m[1];
}
