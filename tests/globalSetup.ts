import { randomBytes } from 'node:crypto';
import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';
import pg from 'pg';
import type { TestProject } from 'vitest/node';

declare module 'vitest' {
  export interface ProvidedContext {
    smtpUrl: string;
    mailSinkUrl: string;
    /** The mail sink's API answers only with this token (as in npm start). */
    mailSinkToken: string;
    appUrl: string;
    /** The card-payment fake: its API and payment pages, and the secret its webhooks are signed with. */
    cardFakeUrl: string;
    stripeWebhookSecret: string;
    stripeSecretKey: string;
  }
}

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(port));
    });
  });
}

/** Drops and recreates the test database so every run starts from the migrations. */
async function recreateDatabase(url: string) {
  const name = new URL(url).pathname.slice(1);
  const admin = new URL(url);
  admin.pathname = '/postgres';
  const client = new pg.Client({ connectionString: admin.toString() });
  await client.connect();
  await client.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
  await client.query(`CREATE DATABASE "${name}"`);
  await client.end();
}

async function waitFor(url: string, child: ChildProcess, seconds: number) {
  const until = Date.now() + seconds * 1000;
  while (Date.now() < until) {
    if (child.exitCode !== null) throw new Error(`The app server exited with code ${child.exitCode}`);
    try {
      const r = await fetch(url);
      if (r.ok) return;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`The app server did not answer ${url} within ${seconds}s`);
}

export default async function setup(project: TestProject) {
  const url = process.env.DATABASE_URL;
  if (!url || !/guyline_test|_test\b/.test(url)) {
    throw new Error('Run the tests with `npm test`: DATABASE_URL must name a test database (it is dropped).');
  }
  await recreateDatabase(url);

  const { migrate } = await import('../server/cli');
  const { seedDemo } = await import('../server/seed/demo');
  const { sequelize } = await import('../server/db');
  await migrate(() => {});
  await seedDemo();
  await sequelize.close();

  const { startMailSink } = await import('../server/fakes/mailSink');
  const mailSinkToken = randomBytes(24).toString('base64url');
  const sink = await startMailSink({ smtpPort: 0, httpPort: 0, token: mailSinkToken });

  // A real app server (built client, job workers) for the browser tests; its workers also send
  // the mail that the API tests queue, and handle the card fake's webhooks.
  const port = await freePort();
  const appUrl = `http://127.0.0.1:${port}`;
  const { startCardFake } = await import('../server/fakes/stripe');
  const stripeWebhookSecret = `whsec_test_${randomBytes(16).toString('hex')}`;
  const stripeSecretKey = 'sk_test_guyline_tests';
  // Short retry delays: a test that makes the app refuse a delivery sees the retry within seconds.
  const card = await startCardFake({ port: 0, webhookUrl: `${appUrl}/api/webhooks/stripe`, webhookSecret: stripeWebhookSecret, apiKey: stripeSecretKey, retryDelaysMs: [300, 1000, 3000, 10_000] });
  // Plain node with tsx's loader, so the server's parent is this process: it stops by itself if
  // the test run dies without its teardown (an orphan would take the next run's mail jobs).
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: {
      ...process.env,
      EXIT_WITH_PARENT: '1',
      NODE_ENV: 'production',
      PORT: String(port),
      APP_URL: appUrl,
      SMTP_URL: sink.smtpUrl,
      MAIL_SINK_URL: sink.httpUrl,
      MAIL_SINK_TOKEN: mailSinkToken,
      FAKES: 'on',
      // A production server with the fakes on runs only as the demo (npm start sets the same).
      GUYLINE_DEMO: 'on',
      STRIPE_SECRET_KEY: stripeSecretKey,
      STRIPE_API_URL: card.url,
      STRIPE_WEBHOOK_SECRET: stripeWebhookSecret,
      LOG_LEVEL: 'warn',
    },
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  await waitFor(`${appUrl}/api/health`, child, 60);

  project.provide('smtpUrl', sink.smtpUrl);
  project.provide('mailSinkUrl', sink.httpUrl);
  project.provide('mailSinkToken', mailSinkToken);
  project.provide('appUrl', appUrl);
  project.provide('cardFakeUrl', card.url);
  project.provide('stripeWebhookSecret', stripeWebhookSecret);
  project.provide('stripeSecretKey', stripeSecretKey);

  return async () => {
    child.kill('SIGTERM');
    await new Promise((r) => setTimeout(r, 300));
    if (child.exitCode === null) child.kill('SIGKILL');
    await sink.close();
    await card.close();
  };
}
