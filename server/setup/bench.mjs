// `npm run bench`: a large company in a cluster of its own, the app in production mode, the
// figures of tests/bench, a table, and the README's Performance section rewritten with it.
// Plain Node built-ins only until the dependencies are installed.
import { spawn, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { ensureClientBuild, ensureDependencies, findPostgres, localSecret, root, runTs, say, startCluster } from './lib.mjs';

ensureDependencies();
const pg = startCluster({ name: 'pg-bench', port: Number(process.env.GUYLINE_BENCH_PG_PORT ?? 54409), anyPort: true });
const databaseUrl = pg.url('guyline_bench');
const dataDir = path.join(root, '.data');
const benchDist = path.join(dataDir, 'bench-dist');
const tsx = path.join(root, 'node_modules', '.bin', 'tsx');
const env = {
  ...process.env,
  NODE_ENV: 'production',
  DATABASE_URL: databaseUrl,
  // Secrets of the bench's own, kept so the generated company's signing key stays readable.
  JWT_SECRET: localSecret('bench-jwt'),
  SIGNING_KEY_SECRET: localSecret('bench-signing-key'),
  FAKES: 'off',
};

let app = null;
function stopApp() {
  if (app && app.exitCode === null && app.signalCode === null) app.kill('SIGTERM');
}
function finish(code) {
  stopApp();
  if (pg.startedHere) pg.stop();
  process.exit(code);
}
for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) process.on(signal, () => finish(130));

/** The generated company is kept between runs; an interrupted generation is thrown away and made again. */
function ensureData() {
  runTs('server/cli.ts', ['migrate'], env);
  const started = Date.now();
  let r = spawnSync(tsx, ['tests/bench/generate.ts'], { cwd: root, env, stdio: 'inherit' });
  if (r.status === 3) {
    say('Dropping the bench database and building it again...');
    const port = new URL(databaseUrl).port;
    const drop = spawnSync(path.join(findPostgres(), 'dropdb'), ['-h', '127.0.0.1', '-p', port, '-U', 'guyline', '--force', 'guyline_bench'], { stdio: 'inherit' });
    if (drop.status !== 0) throw new Error('dropdb failed.');
    runTs('server/cli.ts', ['migrate'], env);
    r = spawnSync(tsx, ['tests/bench/generate.ts'], { cwd: root, env, stdio: 'inherit' });
  }
  if (r.status !== 0) throw new Error('The benchmark data could not be generated; see the lines above.');
  return (Date.now() - started) / 1000;
}

/** The client built with a manifest into .data/bench-dist (never into dist/, which browser tests may be serving). */
function ensureBenchClient() {
  const hash = createHash('sha256');
  const walk = (p) => {
    if (!fs.existsSync(p)) return;
    if (fs.statSync(p).isDirectory()) for (const e of fs.readdirSync(p).sort()) walk(path.join(p, e));
    else hash.update(path.relative(root, p)).update(fs.readFileSync(p));
  };
  for (const p of ['src', 'shared', 'fonts', 'index.html', 'vite.config.ts', 'package-lock.json']) walk(path.join(root, p));
  const digest = hash.digest('hex');
  const stamp = path.join(dataDir, 'bench-dist.source-hash');
  if (fs.existsSync(stamp) && fs.readFileSync(stamp, 'utf8') === digest && fs.existsSync(path.join(benchDist, '.vite', 'manifest.json'))) return;
  say('Building the client with a manifest into .data/bench-dist (vite build)...');
  const r = spawnSync(path.join(root, 'node_modules', '.bin', 'vite'), ['build', '--outDir', benchDist, '--emptyOutDir', '--manifest', '--logLevel', 'warn'], { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) throw new Error('The client build failed; see the lines above.');
  fs.writeFileSync(stamp, digest);
}

function freePort() {
  return new Promise((resolve) => {
    const s = net.createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address();
      s.close(() => resolve(port));
    });
  });
}

async function startApp() {
  const port = await freePort();
  const log = fs.openSync(path.join(dataDir, 'bench-app.log'), 'w');
  // node --import tsx: one process, so its pid is the app's own (the CSV figure reads its memory).
  app = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: root,
    env: { ...env, PORT: String(port), APP_URL: `http://localhost:${port}`, EXIT_WITH_PARENT: '1' },
    stdio: ['ignore', log, log],
  });
  const url = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 240; i++) {
    if (app.exitCode !== null) throw new Error('The app stopped while starting; see .data/bench-app.log.');
    const ok = await fetch(`${url}/api/health`).then((r) => r.ok, () => false);
    if (ok) return url;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error('The app did not answer /api/health within a minute; see .data/bench-app.log.');
}

const cell = (s) => String(s).replace(/\|/g, '\\|');
const verdict = (pass) => (pass === null ? 'missing' : pass ? 'pass' : '**FAIL**');

function table(results) {
  return [
    '| figure | measured | target | pass |',
    '| --- | --- | --- | --- |',
    ...results.map((r) => `| ${cell(r.figure)} | ${cell(r.measured)} | ${cell(r.target)} | ${verdict(r.pass)} |`),
  ].join('\n');
}

function machine(pgVersion, load) {
  const cpus = os.cpus();
  return `${cpus.length} cores (${cpus[0]?.model.trim() ?? 'unknown CPU'}), ${(os.totalmem() / 2 ** 30).toFixed(1)} GB memory, ` +
    `${os.type()} ${os.release()}, Node ${process.version}, PostgreSQL ${pgVersion}; load average ${load}`;
}

function updateReadme(section) {
  const file = path.join(root, 'README.md');
  const text = fs.readFileSync(file, 'utf8');
  const start = '<!-- bench:start -->';
  const end = '<!-- bench:end -->';
  const a = text.indexOf(start);
  const b = text.indexOf(end);
  if (a === -1 || b < a) {
    say(`README.md has no ${start} ... ${end} section; the table was not written there.`);
    return;
  }
  fs.writeFileSync(file, `${text.slice(0, a + start.length)}\n${section}\n${text.slice(b)}`);
  say('README.md: Performance section updated.');
}

let status = 1;
try {
  const generateSeconds = ensureData();
  ensureBenchClient();
  // The app serves dist/ in production: built only when missing, so a browser test serving it is never disturbed.
  if (!fs.existsSync(path.join(root, 'dist', 'index.html'))) ensureClientBuild();
  const loadBefore = os.loadavg()[0];
  const url = await startApp();
  say(`The app runs on ${url} (pid ${app.pid}); running the figures...`);
  const resultsFile = path.join(dataDir, 'bench-results.json');
  fs.rmSync(resultsFile, { force: true });
  const run = spawnSync(tsx, ['tests/bench/run.ts'], {
    cwd: root,
    env: { ...env, LOG_LEVEL: 'warn', BENCH_URL: url, APP_PID: String(app.pid), BENCH_DIST: benchDist, BENCH_RESULTS: resultsFile },
    stdio: 'inherit',
  });
  stopApp();
  if (!fs.existsSync(resultsFile)) throw new Error(`The figures did not finish (exit ${run.status}); see the lines above.`);
  const { results, pgVersion, generated } = JSON.parse(fs.readFileSync(resultsFile, 'utf8'));
  const when = new Date().toISOString().slice(0, 10);
  const data = generated
    ? `The data: one company with ${Object.entries(generated.counts).map(([k, v]) => `${v.toLocaleString('en-US')} ${k.replace(/_/g, ' ')}`).join(', ')}, generated in ${generated.seconds} s.`
    : '';
  // What else the machine was doing: the ratios hold up better than the times, not perfectly.
  const load = `${loadBefore.toFixed(1)} when the figures started and ${os.loadavg()[0].toFixed(1)} when they ended`;
  const section = [`Measured on ${when} on ${machine(pgVersion, load)}. ${data}`, '', table(results)].join('\n');
  console.log('');
  console.log(table(results));
  console.log('');
  say(`Generator: ${generated ? `${generated.seconds} s when the data was built (${generated.at.slice(0, 10)})` : 'unknown'}; this run's data step took ${generateSeconds.toFixed(0)} s.`);
  // A run of some figures only (BENCH_ONLY) is for working on them, not for the README.
  if (process.env.BENCH_ONLY) say('BENCH_ONLY is set: README.md left as it was.');
  else updateReadme(section);
  const failed = results.filter((r) => r.pass !== true);
  status = failed.length ? 1 : 0;
  say(failed.length ? `${failed.length} figure(s) did not pass: ${failed.map((r) => r.key).join(', ')}.` : 'Every figure passed.');
} catch (err) {
  console.error(`[guyline] ${err.message}`);
  status = 1;
}
finish(status);
