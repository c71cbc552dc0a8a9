/**
 * PostgreSQL restarted under load. While it is down every request fails cleanly (503 in the usual
 * error shape, nothing half-saved) and /api/health says the database is down; when it is back the
 * product recovers by itself: the connection pool reconnects, and so does the job queue.
 *
 * The cluster is one of this file's own (server/setup/lib.mjs startCluster, as `npm test` makes
 * its own), so stopping it disturbs no other test.
 */
import { spawn } from 'node:child_process';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AppProcess, caughtMail, freePort, freshDatabase, pause, pollUntil, RemoteClient, root, type Reply } from './support';

interface Cluster {
  url(db: string): string;
  stop(): void;
}
// Plain Node set-up code (it runs before node_modules exists), so it carries no types.
const lib = (await import(/* @vite-ignore */ path.join(root, 'server', 'setup', 'lib.mjs'))) as {
  startCluster(o: { name: string; port: number; anyPort?: boolean }): Cluster;
  findPostgres(): string;
  dataRoot(): string;
};

// Named after the test cluster's port, so two test runs side by side never share it.
const clusterName = `pg-faults-${new URL(process.env.DATABASE_URL!).port}`;
let cluster = lib.startCluster({ name: clusterName, port: await freePort(), anyPort: true });
const clusterPort = Number(new URL(cluster.url('x')).port);
const db = await freshDatabase('restart', cluster.url('postgres'));
process.env.DATABASE_URL = db.url;

const { migrate } = await import('../../../server/cli');
const { Customer } = await import('../../../server/models');
const { startMailSink } = await import('../../../server/fakes/mailSink');
const { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } = await import('../../factories');

/** pg_ctl stop -m fast, as lib.mjs stops a cluster, but without blocking this process: the load goes on meanwhile. */
function stopClusterInBackground(): Promise<number | null> {
  const pgCtl = path.join(lib.findPostgres(), 'pg_ctl');
  const args = ['stop', '-D', path.join(lib.dataRoot(), clusterName), '-m', 'fast', '-w'];
  const asRoot = process.getuid?.() === 0;
  const child = asRoot ? spawn('runuser', ['-u', 'postgres', '--', pgCtl, ...args], { cwd: '/', stdio: 'ignore' }) : spawn(pgCtl, args, { stdio: 'ignore' });
  return new Promise((resolve) => child.once('exit', resolve));
}

let sink: Awaited<ReturnType<typeof startMailSink>>;
let app: AppProcess;

beforeAll(async () => {
  await migrate(() => {});
  sink = await startMailSink({ smtpPort: 0, httpPort: 0 });
  app = new AppProcess('app', await freePort(), { DATABASE_URL: db.url, SMTP_URL: sink.smtpUrl, MAIL_SINK_URL: sink.httpUrl });
  await app.start();
});

afterAll(async () => {
  await app?.stop();
  await sink?.close();
  await db.drop().catch(() => {});
  cluster.stop();
}, 60_000);

type Phase = 'up' | 'down' | 'back';

/** Reads that every screen makes, asked over and over by a few clients at once. */
function startLoad(client: RemoteClient, routes: string[], clients = 6) {
  const replies: { phase: Phase; route: string; reply: Reply | { status: 'no answer'; body: string } }[] = [];
  const state = { phase: 'up' as Phase, running: true };
  const loops = Array.from({ length: clients }, async (_, k) => {
    for (let i = k; state.running; i++) {
      const route = routes[i % routes.length];
      const phase = state.phase;
      const reply = await client.get(`${app.url}${route}`).catch((err: Error) => ({ status: 'no answer' as const, body: err.message }));
      replies.push({ phase, route, reply });
      await pause(20);
    }
  });
  return {
    replies,
    state,
    async stop() {
      state.running = false;
      await Promise.all(loops);
    },
  };
}

const isUnavailable = (r: { status: unknown; body: unknown }) =>
  r.status === 503 &&
  typeof (r.body as { error?: { message?: unknown } })?.error?.message === 'string' &&
  (r.body as { error: { code: string } }).error.code === 'database_unavailable';

describe('PostgreSQL restarted under load', () => {
  it('requests get a clean 503 and health says the database is down; the pool and the job queue reconnect by themselves', { timeout: 180_000 }, async () => {
    const c = await buildCompany();
    const customer = await buildCustomer(c.organization.id, { name: 'Ilse Marrow', email: `ilse.${process.pid}@example.test` });
    const tent = await buildItem(c.organization.id, { name: '30x40 pole tent', kind: 'tent', tentType: 'pole', widthFt: 30, lengthFt: 40, quantityOwned: 2, rentalPriceCents: 90_000 });
    const office = await new RemoteClient().signIn(app.url, c.office.email, TEST_PASSWORD);
    const booking = await office.post(`${app.url}/api/bookings`, bookingBody(customer.id, '2027-08-21', [{ itemId: tent.id, quantity: 1 }]));
    expect(booking.status).toBe(201);
    const routes = ['/api/bookings', '/api/customers', '/api/items', '/api/auth/me', `/api/bookings/${booking.body.id}`, `/api/customers/${customer.id}`];

    const load = startLoad(office, routes);
    await pollUntil('a few answers under load', async () => load.replies.length >= 30);
    expect(load.replies.filter((r) => r.reply.status !== 200)).toEqual([]);

    // Down: a fast shutdown cuts every connection, in the middle of the load.
    load.state.phase = 'down';
    expect(await stopClusterInBackground()).toBe(0);
    const down = await pollUntil('the health check to notice', async () => {
      const r = await office.get(`${app.url}/api/health`);
      return r.status === 503 ? r : undefined;
    });
    expect(down.body).toEqual({ ok: false, database: 'down' });
    const seenDown = load.replies.length;
    await pollUntil('some reads while the database is down', async () => load.replies.length >= seenDown + 30);
    const whileDown = load.replies.slice(seenDown);
    expect(whileDown.filter((r) => !isUnavailable(r.reply))).toEqual([]);
    // A write while down: the same clean answer, and nothing of it is saved.
    const write = await office.post(`${app.url}/api/customers`, { name: `Written while down ${process.pid}` });
    expect(isUnavailable(write)).toBe(true);

    // Back: the same cluster on the same port; nobody restarts the app.
    cluster = lib.startCluster({ name: clusterName, port: clusterPort });
    const up = await pollUntil('the health check to see the database again', async () => {
      const r = await office.get(`${app.url}/api/health`);
      return r.status === 200 ? r : undefined;
    }, { tries: 300, everyMs: 200 });
    expect(up.body).toEqual({ ok: true, database: 'up' });
    load.state.phase = 'back';
    await pollUntil('the reads to succeed again', async () => {
      const latest = load.replies.filter((r) => r.phase === 'back').slice(-routes.length * 2);
      return latest.length === routes.length * 2 && latest.every((r) => r.reply.status === 200);
    }, { tries: 300, everyMs: 200 });
    const recovered = load.replies.length;
    await pollUntil('more reads after recovery', async () => load.replies.length >= recovered + 60);
    await load.stop();
    expect(load.replies.slice(recovered).filter((r) => r.reply.status !== 200)).toEqual([]);

    // Never a 500, a dropped connection or another shape: a 200 or the clean 503, throughout.
    expect(load.replies.filter((r) => r.reply.status !== 200 && !isUnavailable(r.reply))).toEqual([]);
    expect(load.replies.filter((r) => r.phase === 'down').length).toBeGreaterThan(0);
    expect(await Customer.count({ where: { name: `Written while down ${process.pid}` } })).toBe(0);
    expect(app.child!.exitCode).toBeNull();

    // The job queue reconnected too: a password reset queued now is e-mailed by the app's worker.
    const reset = await office.post(`${app.url}/api/auth/password-reset/request`, { email: c.owner.email });
    expect(reset.status).toBe(202);
    await pollUntil('the reset e-mail', async () => (await caughtMail(sink.httpUrl)).some((m) => m.to.includes(c.owner.email) && /Reset your Guyline password/.test(m.subject)), { tries: 300, everyMs: 200 });
  });
});
