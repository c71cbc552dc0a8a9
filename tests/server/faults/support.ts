/**
 * Helpers for the fault tests: a database of the test file's own, real app processes started and
 * killed like production ones, and a small HTTP client that keeps one cookie jar across them.
 *
 * Import no server module from here: a fault test points process.env at its own database first,
 * then imports the server code it uses.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import { CSRF_COOKIE, CSRF_HEADER } from '../../../shared/types';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', '..');

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(port));
    });
  });
}

export const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * Polls `check` until it returns a value other than undefined/false, at most `tries` times with
 * `everyMs` between: no assertion on time, only a generous cap on how often we look.
 */
export async function pollUntil<T>(
  what: string,
  check: () => Promise<T | undefined | false>,
  { tries = 300, everyMs = 200, state }: { tries?: number; everyMs?: number; state?: () => Promise<unknown> } = {},
): Promise<T> {
  let last: unknown;
  for (let i = 0; i < tries; i++) {
    try {
      const v = await check();
      if (v !== undefined && v !== false) return v as T;
    } catch (err) {
      last = err;
    }
    await pause(everyMs);
  }
  const seen = state ? `; last seen: ${JSON.stringify(await state().catch((e: Error) => e.message))}` : '';
  throw new Error(`Gave up waiting for ${what} after ${tries} looks${last ? ` (last error: ${(last as Error).message})` : ''}${seen}.`);
}

async function onAdmin(url: string, work: (c: pg.Client) => Promise<void>) {
  const admin = new URL(url);
  admin.pathname = '/postgres';
  const c = new pg.Client({ connectionString: admin.toString() });
  await c.connect();
  try {
    await work(c);
  } finally {
    await c.end();
  }
}

/**
 * A fresh database beside the test database (same cluster), so the app processes started here
 * have job queues of their own: the shared app server's workers never take their jobs.
 */
export async function freshDatabase(label: string, clusterUrl = process.env.DATABASE_URL!) {
  const url = new URL(clusterUrl);
  const name = `guyline_faults_${label}_${process.pid}`;
  url.pathname = `/${name}`;
  await onAdmin(url.toString(), async (c) => {
    await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
    await c.query(`CREATE DATABASE "${name}"`);
  });
  return {
    url: url.toString(),
    drop: () => onAdmin(url.toString(), async (c) => void (await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`))),
  };
}

/** One line of an app's pino log (JSON), when it is one. */
export type LogLine = Record<string, unknown> & { msg?: string };

/** A real Guyline server process (`node --import tsx server/index.ts`), as production runs it. */
export class AppProcess {
  child: ChildProcess | null = null;
  /** Everything it printed, for the failure message and for reading its log. */
  output: string[] = [];
  starts = 0;

  constructor(
    readonly name: string,
    readonly port: number,
    private readonly env: Record<string, string>,
  ) {}

  get url() {
    return `http://127.0.0.1:${this.port}`;
  }

  async start() {
    this.starts += 1;
    const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
      cwd: root,
      env: {
        ...process.env,
        // The app stops by itself when this test worker is gone (see server/index.ts).
        EXIT_WITH_PARENT: '1',
        NODE_ENV: 'test',
        HOST: '127.0.0.1',
        PORT: String(this.port),
        APP_URL: this.url,
        FAKES: 'on',
        LOG_LEVEL: 'info',
        ...this.env,
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    this.child = child;
    let partial = '';
    const keep = (chunk: Buffer) => {
      const lines = (partial + chunk.toString('utf8')).split('\n');
      partial = lines.pop() ?? '';
      this.output.push(...lines);
    };
    child.stdout!.on('data', keep);
    child.stderr!.on('data', keep);
    await pollUntil(`${this.name} to answer /api/health`, async () => {
      if (child.exitCode !== null) throw new Error(`${this.name} exited with code ${child.exitCode}:\n${this.tail()}`);
      const r = await fetch(`${this.url}/api/health`).catch(() => null);
      return r?.ok;
    }, { tries: 600, everyMs: 200 }).catch((err) => {
      throw new Error(`${(err as Error).message}\n${this.tail()}`);
    });
  }

  /** The last lines it printed. */
  tail(n = 40) {
    return this.output.slice(-n).join('\n');
  }

  /** Its log lines that parse as JSON. */
  log(): LogLine[] {
    return this.output.flatMap((l) => {
      if (!l.startsWith('{')) return [];
      try {
        return [JSON.parse(l) as LogLine];
      } catch {
        return [];
      }
    });
  }

  /** Gone at once, like a pulled plug: no shutdown handler runs. */
  async kill() {
    const child = this.child;
    if (!child || child.exitCode !== null || child.signalCode !== null) return;
    const exited = new Promise((r) => child.once('exit', r));
    child.kill('SIGKILL');
    await exited;
  }

  async stop() {
    const child = this.child;
    if (!child || child.exitCode !== null || child.signalCode !== null) return;
    const exited = new Promise((r) => child.once('exit', r));
    child.kill('SIGTERM');
    const done = await Promise.race([exited.then(() => true), pause(8_000).then(() => false)]);
    if (!done) await this.kill();
  }
}

export interface Reply {
  status: number;
  body: any; // eslint-disable-line @typescript-eslint/no-explicit-any
}

let ipSeq = 0;

/**
 * A browser-like client for real app processes over fetch: one cookie jar for every app on
 * 127.0.0.1 (cookies do not care about the port, as in a browser behind a load balancer), the
 * CSRF header on writes, and its own address in X-Forwarded-For so rate limits never cross tests.
 */
export class RemoteClient {
  cookies = new Map<string, string>();
  readonly ip = `2001:db8:fa::${process.pid.toString(16)}:${(++ipSeq).toString(16)}`;

  private remember(res: Response) {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const eq = pair.indexOf('=');
      const name = pair.slice(0, eq);
      const value = pair.slice(eq + 1);
      if (/max-age=0|expires=Thu, 01 Jan 1970/i.test(c) || value === '') this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }

  async send(method: string, url: string, body?: unknown): Promise<Reply> {
    const headers: Record<string, string> = { 'X-Forwarded-For': this.ip, Accept: 'application/json' };
    if (this.cookies.size) headers.Cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
    if (method !== 'GET') {
      const csrf = this.cookies.get(CSRF_COOKIE);
      if (csrf) headers[CSRF_HEADER] = csrf;
    }
    if (body !== undefined) headers['Content-Type'] = 'application/json';
    const res = await fetch(url, { method, headers, body: body === undefined ? undefined : JSON.stringify(body), redirect: 'manual' });
    this.remember(res);
    const text = await res.text();
    let parsed: unknown = text;
    try {
      parsed = text ? JSON.parse(text) : null;
    } catch {
      /* not JSON */
    }
    return { status: res.status, body: parsed };
  }

  get(url: string) {
    return this.send('GET', url);
  }
  post(url: string, body?: unknown) {
    return this.send('POST', url, body);
  }

  /** Picks up the CSRF cookie and signs in on the given app. */
  async signIn(appUrl: string, email: string, password: string) {
    await this.get(`${appUrl}/api/health`);
    const r = await this.post(`${appUrl}/api/auth/login`, { email, password });
    if (r.status !== 200) throw new Error(`sign-in of ${email} on ${appUrl} failed: ${r.status} ${JSON.stringify(r.body)}`);
    return this;
  }
}

/** What the mail sink caught, as its HTTP API gives it (newest first). */
export async function caughtMail(sinkHttpUrl: string): Promise<{ to: string[]; subject: string; attachments: { filename: string }[] }[]> {
  return (await fetch(`${sinkHttpUrl}/messages`)).json();
}

/** How many caught messages there are per "recipient | subject". */
export function countByRecipientAndSubject(messages: { to: string[]; subject: string }[]) {
  const counts = new Map<string, number>();
  for (const m of messages) {
    const key = `${m.to.join(',')} | ${m.subject}`;
    counts.set(key, (counts.get(key) ?? 0) + 1);
  }
  return counts;
}
