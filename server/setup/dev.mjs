// `npm run dev`: PostgreSQL, the local fakes and the API with reload on :3001, and Vite with hot reload on :5173.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { ensureDependencies, localSecret, root, runTs, say, startCluster } from './lib.mjs';

ensureDependencies();
const pg = startCluster({ name: 'pg', port: Number(process.env.GUYLINE_PG_PORT ?? 54329) });
const apiPort = process.env.API_PORT ?? '3001';
const vitePort = process.env.VITE_PORT ?? '5173';
const env = {
  ...process.env,
  NODE_ENV: 'development',
  PORT: apiPort,
  API_PORT: apiPort,
  DATABASE_URL: process.env.DATABASE_URL ?? pg.url('guyline'),
  JWT_SECRET: process.env.JWT_SECRET ?? localSecret('jwt'),
  SIGNING_KEY_SECRET: process.env.SIGNING_KEY_SECRET ?? localSecret('signing-key'),
  APP_URL: `http://localhost:${vitePort}`,
  SMTP_URL: 'smtp://127.0.0.1:2525',
  MAIL_SINK_URL: 'http://127.0.0.1:2526',
  MAIL_SINK_TOKEN: process.env.MAIL_SINK_TOKEN ?? localSecret('mail-sink'),
  FAKES: 'on',
  GUYLINE_DEMO: 'on',
};
runTs('server/cli.ts', ['setup'], env);
const bin = (n) => path.join(root, 'node_modules', '.bin', n);
const children = [
  spawn(bin('tsx'), ['server/fakes/run.ts'], { cwd: root, env, stdio: 'inherit' }),
  spawn(bin('tsx'), ['watch', '--clear-screen=false', 'server/index.ts'], { cwd: root, env, stdio: 'inherit' }),
  spawn(bin('vite'), [], { cwd: root, env, stdio: 'inherit' }),
];
say(`Open http://localhost:${vitePort} (API on :${apiPort}). Ctrl-C stops everything.`);
let stopping = false;
const stop = () => {
  if (stopping) return;
  stopping = true;
  for (const c of children) c.kill('SIGTERM');
  setTimeout(() => {
    if (pg.startedHere) pg.stop();
    process.exit(0);
  }, 800);
};
for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) process.on(signal, stop);
for (const c of children) {
  c.on('exit', (code) => {
    if (!stopping) {
      say(`A process stopped (exit ${code}); stopping everything.`);
      stop();
    }
  });
}
