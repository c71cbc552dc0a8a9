// `npm start`: sets everything up and runs the product. Plain Node built-ins only.
import {
  assertPortsFree, ensureClientBuild, ensureDependencies, localSecret, runTs, say, spawnTs, startCluster,
} from './lib.mjs';

ensureDependencies();
const pgPort = Number(process.env.GUYLINE_PG_PORT ?? 54329);
const pg = startCluster({ name: 'pg', port: pgPort });
const port = Number(process.env.PORT ?? 3000);
const smtpPort = Number(process.env.MAIL_SINK_SMTP_PORT ?? 2525);
const sinkHttpPort = Number(process.env.MAIL_SINK_HTTP_PORT ?? 2526);
const cardPort = Number(process.env.CARD_FAKE_PORT ?? 2527);

await assertPortsFree({
  'the app, PORT': port, 'the mail sink, MAIL_SINK_SMTP_PORT': smtpPort, 'the mail sink, MAIL_SINK_HTTP_PORT': sinkHttpPort,
  ...(process.env.STRIPE_API_URL ? {} : { 'the card-payment fake, CARD_FAKE_PORT': cardPort }),
});

const env = {
  ...process.env,
  NODE_ENV: 'production',
  PORT: String(port),
  DATABASE_URL: process.env.DATABASE_URL ?? pg.url('guyline'),
  JWT_SECRET: process.env.JWT_SECRET ?? localSecret('jwt'),
  SIGNING_KEY_SECRET: process.env.SIGNING_KEY_SECRET ?? localSecret('signing-key'),
  APP_URL: process.env.APP_URL ?? `http://localhost:${port}`,
  SMTP_URL: process.env.SMTP_URL ?? `smtp://127.0.0.1:${smtpPort}`,
  MAIL_SINK_URL: process.env.MAIL_SINK_URL ?? `http://127.0.0.1:${sinkHttpPort}`,
  MAIL_SINK_SMTP_PORT: String(smtpPort),
  MAIL_SINK_HTTP_PORT: String(sinkHttpPort),
  // The sink's own API holds every caught link: only the app (which has this token) reads it.
  MAIL_SINK_TOKEN: process.env.MAIL_SINK_TOKEN ?? localSecret('mail-sink'),
  FAKES: process.env.FAKES ?? 'on',
  // This is the demo: the production server refuses to run with the fakes on without this.
  GUYLINE_DEMO: process.env.GUYLINE_DEMO ?? 'on',
  // Card payments go to the local fake on loopback unless real settings are given.
  CARD_FAKE_PORT: String(cardPort),
  STRIPE_SECRET_KEY: process.env.STRIPE_SECRET_KEY ?? 'sk_test_guyline_local',
  STRIPE_API_URL: process.env.STRIPE_API_URL ?? `http://127.0.0.1:${cardPort}`,
  STRIPE_WEBHOOK_SECRET: process.env.STRIPE_WEBHOOK_SECRET ?? `whsec_${localSecret('card-webhook').slice(0, 32)}`,
  STRIPE_WEBHOOK_URL: process.env.STRIPE_WEBHOOK_URL ?? `http://127.0.0.1:${port}/api/webhooks/stripe`,
};

const children = [];
let stopping = false;
async function stopAll(code = 0) {
  if (stopping) return;
  stopping = true;
  say('Stopping...');
  const running = children.filter((c) => c.exitCode === null && c.signalCode === null);
  await Promise.race([
    Promise.all(running.map((c) => new Promise((resolve) => { c.once('exit', resolve); c.kill('SIGTERM'); }))),
    new Promise((resolve) => setTimeout(resolve, 5000)),
  ]);
  for (const c of running) if (c.exitCode === null && c.signalCode === null) c.kill('SIGKILL');
  if (pg.startedHere) pg.stop();
  process.exit(code);
}
for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) process.on(signal, () => stopAll(0));
// When npm itself is killed without passing the signal on, stop too instead of living on as an orphan.
const parent = process.ppid;
setInterval(() => {
  try {
    process.kill(parent, 0);
  } catch {
    stopAll(0);
  }
}, 1000).unref();

try {
  runTs('server/cli.ts', ['setup'], env);
  ensureClientBuild();
} catch (err) {
  if (pg.startedHere) pg.stop();
  throw err;
}

const fakes = spawnTs('server/fakes/run.ts', [], env);
const app = spawnTs('server/index.ts', [], env);
children.push(fakes, app);
for (const c of children) {
  c.on('exit', (code) => {
    if (!stopping) {
      say(`A process stopped unexpectedly (exit ${code}); stopping everything.`);
      stopAll(1);
    }
  });
}

setTimeout(() => {
  if (stopping) return;
  say('');
  say(`Guyline runs on ${env.APP_URL}`);
  say(`Caught mail: ${env.APP_URL}/app/dev/mail (the local mail sink; each company's owner sees that company's mail)`);
  // A new company's sign-up link is sent before the company exists, so no owner's inbox shows it.
  say(`Sign-up links (no company yet): curl -s -H "Authorization: Bearer $(cat .data/mail-sink.secret)" ${env.MAIL_SINK_URL}/messages`);
  say('Demo sign-ins, password guyline-demo for each:');
  say('  owner@demo.test   office@demo.test   crew@demo.test   books@demo.test');
  say('Press Ctrl-C to stop everything (PostgreSQL too).');
}, 2500);
