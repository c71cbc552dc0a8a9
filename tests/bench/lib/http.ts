/**
 * A small keep-alive HTTP client for the figures: one connection reused, the owner's session
 * cookie and CSRF token sent with every request, the body read to its last byte.
 */
import http from 'node:http';
import { CSRF_COOKIE, CSRF_HEADER, SESSION_COOKIE } from '../../../shared/types';

export interface Reply {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: Buffer;
  ms: number;
}

export class BenchClient {
  private readonly agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
  private cookies = new Map<string, string>();

  constructor(readonly base: string) {}

  get cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  get csrf(): string {
    return this.cookies.get(CSRF_COOKIE) ?? '';
  }

  /** Sends a request; `onChunk` sees the body as it streams (then `body` stays empty). */
  request(method: string, path: string, opts: { json?: unknown; onChunk?: (chunk: Buffer) => void; retried?: boolean } = {}): Promise<Reply> {
    const payload = opts.json === undefined ? undefined : Buffer.from(JSON.stringify(opts.json));
    const headers: Record<string, string> = { accept: '*/*' };
    if (this.cookies.size) headers.cookie = this.cookieHeader;
    if (payload) {
      headers['content-type'] = 'application/json';
      headers['content-length'] = String(payload.length);
    }
    if (method !== 'GET' && this.csrf) headers[CSRF_HEADER] = this.csrf;
    const started = performance.now();
    return new Promise((resolve, reject) => {
      const req = http.request(new URL(path, this.base), { method, headers, agent: this.agent }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => (opts.onChunk ? opts.onChunk(c) : chunks.push(c)));
        res.on('end', () => {
          for (const line of res.headers['set-cookie'] ?? []) {
            const [pair] = line.split(';');
            const eq = pair.indexOf('=');
            const name = pair.slice(0, eq).trim();
            const value = pair.slice(eq + 1).trim();
            if (value) this.cookies.set(name, value);
            else this.cookies.delete(name);
          }
          resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks), ms: performance.now() - started });
        });
        res.on('error', reject);
      });
      req.on('error', (err: NodeJS.ErrnoException) => {
        // The server may close an idle kept-alive socket just as it is reused: Node's documented
        // remedy is to send the request again on a new socket.
        if (req.reusedSocket && err.code === 'ECONNRESET' && !opts.retried) resolve(this.request(method, path, { ...opts, retried: true }));
        else reject(err);
      });
      req.end(payload);
    });
  }

  async json<T>(method: string, path: string, body?: unknown): Promise<{ status: number; data: T; ms: number }> {
    const r = await this.request(method, path, { json: body });
    return { status: r.status, data: (r.body.length ? JSON.parse(r.body.toString('utf8')) : null) as T, ms: r.ms };
  }

  /** Signs in once (the login limiter counts failures only; the bench never fails one). */
  async signIn(email: string, password: string): Promise<void> {
    await this.request('GET', '/api/health');
    const r = await this.json<{ user?: unknown; error?: { message: string } }>('POST', '/api/auth/login', { email, password });
    if (r.status !== 200 || !this.cookies.has(SESSION_COOKIE)) throw new Error(`Signing in as ${email} failed: ${r.status} ${JSON.stringify(r.data)}`);
  }

  close() {
    this.agent.destroy();
  }
}
