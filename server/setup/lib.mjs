// Set-up helpers for `npm start` and `npm test`. Plain Node built-ins only: this file runs
// before the project's dependencies are installed.
import { spawn, spawnSync } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

export function say(line) {
  process.stdout.write(`[guyline] ${line}\n`);
}

export function fail(line) {
  process.stderr.write(`[guyline] ${line}\n`);
  process.exit(1);
}

function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { stdio: 'inherit', cwd: root, ...opts });
  if (r.error) throw r.error;
  return r.status ?? 1;
}

function runQuiet(cmd, args, opts = {}) {
  return spawnSync(cmd, args, { encoding: 'utf8', cwd: root, ...opts });
}

/** Installs the npm dependencies when node_modules is missing or older than the lock file. */
export function ensureDependencies() {
  const marker = path.join(root, 'node_modules', '.package-lock.json');
  const lock = path.join(root, 'package-lock.json');
  const stale =
    !fs.existsSync(marker) ||
    (fs.existsSync(lock) && fs.statSync(lock).mtimeMs > fs.statSync(marker).mtimeMs + 1000);
  if (!stale) return;
  say('Installing dependencies (npm ci)...');
  const args = fs.existsSync(lock) ? ['ci'] : ['install'];
  const status = run('npm', [...args, '--no-audit', '--no-fund'], { stdio: ['ignore', 'inherit', 'inherit'] });
  if (status !== 0) fail('npm could not install the dependencies; see the lines above.');
}

/** Finds Debian's PostgreSQL server binaries, installing them with apt when missing and root. */
export function findPostgres() {
  const candidates = () => {
    const base = '/usr/lib/postgresql';
    if (!fs.existsSync(base)) return [];
    return fs
      .readdirSync(base)
      .filter((v) => fs.existsSync(path.join(base, v, 'bin', 'initdb')))
      .sort((a, b) => Number(b) - Number(a))
      .map((v) => path.join(base, v, 'bin'));
  };
  let found = candidates();
  if (found.length === 0 && isRoot) {
    say('PostgreSQL server not found: installing Debian\'s postgresql package...');
    run('apt-get', ['update', '-qq'], { stdio: ['ignore', 'inherit', 'inherit'] });
    const status = run('apt-get', ['install', '-y', '-qq', 'postgresql'], {
      stdio: ['ignore', 'inherit', 'inherit'],
      env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    });
    if (status !== 0) fail('apt-get could not install postgresql.');
    found = candidates();
  }
  if (found.length === 0) {
    fail(
      'PostgreSQL server binaries were not found in /usr/lib/postgresql/<version>/bin. ' +
        'Install them with: sudo apt-get install -y postgresql   (then run this again).',
    );
  }
  return found[0];
}

/**
 * Makes sure Debian packages are installed (checked by the program each provides), installing the
 * missing ones with apt when root; otherwise stops with the command to run.
 */
export function ensureDebianPackages(packages) {
  const missing = Object.entries(packages).filter(([, program]) => !fs.existsSync(program)).map(([pkg]) => pkg);
  if (missing.length === 0) return;
  if (!isRoot) fail(`The tests need Debian packages: sudo apt-get install -y ${missing.join(' ')}`);
  say(`Installing Debian packages: ${missing.join(', ')}...`);
  run('apt-get', ['update', '-qq'], { stdio: ['ignore', 'inherit', 'inherit'] });
  const status = run('apt-get', ['install', '-y', '-qq', '--no-install-recommends', ...missing], {
    stdio: ['ignore', 'inherit', 'inherit'],
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
  const still = Object.entries(packages).filter(([, program]) => !fs.existsSync(program)).map(([pkg]) => pkg);
  if (status !== 0 || still.length) fail(`apt-get could not install ${still.join(', ')}.`);
}

/** Debian's chromium for the browser tests. */
export function ensureChromium() {
  ensureDebianPackages({ chromium: '/usr/bin/chromium' });
  return '/usr/bin/chromium';
}

/** Whether the `postgres` user can enter every folder on the way to dir. */
function postgresCanReach(dir) {
  const r = runQuiet('runuser', ['-u', 'postgres', '--', 'test', '-x', dir], { cwd: '/' });
  return r.status === 0;
}

/**
 * The folder that holds the project's clusters: `.data` in the project, or, when running as root
 * and the `postgres` user cannot reach the project (a clone under a private home folder), a folder
 * under /var/tmp named after the project path.
 */
export function dataRoot() {
  const local = path.join(root, '.data');
  fs.mkdirSync(local, { recursive: true });
  if (!isRoot || postgresCanReach(local)) return local;
  const hash = createHash('sha256').update(root).digest('hex').slice(0, 10);
  const fallback = path.join('/var/tmp', `guyline-${hash}`);
  fs.mkdirSync(fallback, { recursive: true });
  say(`The postgres user cannot reach ${local}; keeping the database in ${fallback} instead.`);
  return fallback;
}

function asPostgres(bin, args, opts = {}) {
  // cwd '/': the postgres user may not be allowed into the project folder.
  return isRoot ? runQuiet('runuser', ['-u', 'postgres', '--', bin, ...args], { cwd: '/', ...opts }) : runQuiet(bin, args, opts);
}

function chownToPostgres(p) {
  if (isRoot) runQuiet('chown', ['-R', 'postgres:postgres', p]);
}

/**
 * Creates (first run) and starts a PostgreSQL cluster on 127.0.0.1:port in <dataRoot>/<name>.
 * Returns { url(dbName), stop(), startedHere }.
 */
export function startCluster({ name, port: wantedPort, anyPort = false }) {
  let port = wantedPort;
  const bin = findPostgres();
  const base = dataRoot();
  const dir = path.join(base, name);
  const socketDir = path.join(base, `${name}-run`);
  const log = path.join(base, `${name}.log`);
  fs.mkdirSync(socketDir, { recursive: true });
  if (!fs.existsSync(path.join(dir, 'PG_VERSION'))) {
    say(`Creating a PostgreSQL cluster in ${dir}...`);
    fs.mkdirSync(dir, { recursive: true });
    chownToPostgres(dir);
    const r = asPostgres(path.join(bin, 'initdb'), [
      '-D', dir, '-U', 'guyline', '--auth=trust', '--encoding=UTF8', '--locale=C.UTF-8',
    ]);
    if (r.status !== 0) fail(`initdb failed:\n${r.stdout}\n${r.stderr}`);
  }
  chownToPostgres(socketDir);
  if (!fs.existsSync(log)) fs.writeFileSync(log, '');
  chownToPostgres(log);

  const pgCtl = path.join(bin, 'pg_ctl');
  const status = asPostgres(pgCtl, ['status', '-D', dir]);
  let startedHere = false;
  if (status.status === 0) {
    const pid = fs.readFileSync(path.join(dir, 'postmaster.pid'), 'utf8').split('\n');
    if (anyPort) port = Number(pid[3]);
    if (Number(pid[3]) !== port) fail(`The cluster in ${dir} already runs on port ${pid[3]}, not ${port}; stop it first.`);
    say(`PostgreSQL is already running on 127.0.0.1:${port}; reusing it.`);
  } else {
    // Another clone's tests may hold the usual port: then take any free one.
    if (anyPort && !portIsFree(port)) port = freePortSync();
    if (!portIsFree(port)) {
      fail(`Port ${port} is already in use (another Guyline's database?). Stop it, or choose another port with GUYLINE_PG_PORT=...`);
    }
    const r = asPostgres(pgCtl, [
      'start', '-D', dir, '-l', log, '-w', '-t', '60',
      '-o', `-p ${port} -k ${socketDir} -c listen_addresses=127.0.0.1 -c max_connections=200`,
    ]);
    if (r.status !== 0) {
      const tail = fs.existsSync(log) ? fs.readFileSync(log, 'utf8').split('\n').slice(-15).join('\n') : '';
      fail(`PostgreSQL did not start on 127.0.0.1:${port}:\n${r.stdout}${r.stderr}\n${tail}`);
    }
    startedHere = true;
    say(`PostgreSQL started on 127.0.0.1:${port}.`);
  }
  return {
    url: (db) => `postgres://guyline@127.0.0.1:${port}/${db}`,
    startedHere,
    stop() {
      asPostgres(pgCtl, ['stop', '-D', dir, '-m', 'fast', '-w']);
      say('PostgreSQL stopped.');
    },
  };
}

function portIsFree(port) {
  const r = spawnSync(process.execPath, ['-e', `require('net').createServer().once('error',()=>process.exit(1)).listen(${port},'127.0.0.1',function(){this.close(()=>process.exit(0))})`]);
  return r.status === 0;
}

function freePortSync() {
  const r = spawnSync(process.execPath, ['-e', `const s=require('net').createServer().listen(0,'127.0.0.1',()=>{console.log(s.address().port);s.close()})`], { encoding: 'utf8' });
  return Number(r.stdout.trim());
}

/** Fails with a clear message when one of the ports is taken (another `npm start`, say). */
export async function assertPortsFree(ports) {
  const net = await import('node:net');
  for (const [what, port] of Object.entries(ports)) {
    const free = await new Promise((resolve) => {
      const s = net.createServer();
      s.once('error', () => resolve(false));
      s.listen(port, '127.0.0.1', () => s.close(() => resolve(true)));
    });
    if (!free) fail(`Port ${port} (${what}) is already in use: is another Guyline running? Stop it, or choose another port.`);
  }
}

/** A secret kept in the data folder so sessions survive a restart of `npm start`. */
export function localSecret(name) {
  const file = path.join(root, '.data', `${name}.secret`);
  fs.mkdirSync(path.dirname(file), { recursive: true });
  if (!fs.existsSync(file)) fs.writeFileSync(file, randomBytes(48).toString('base64url'), { mode: 0o600 });
  return fs.readFileSync(file, 'utf8').trim();
}

/** Builds the client with Vite when dist/ is missing or older than its sources. */
export function ensureClientBuild() {
  const stamp = path.join(root, 'dist', '.source-hash');
  const hash = createHash('sha256');
  const walk = (p) => {
    if (!fs.existsSync(p)) return;
    const st = fs.statSync(p);
    if (st.isDirectory()) {
      for (const e of fs.readdirSync(p).sort()) walk(path.join(p, e));
    } else {
      hash.update(path.relative(root, p));
      hash.update(fs.readFileSync(p));
    }
  };
  for (const p of ['src', 'shared', 'fonts', 'index.html', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json']) {
    walk(path.join(root, p));
  }
  const digest = hash.digest('hex');
  if (fs.existsSync(stamp) && fs.readFileSync(stamp, 'utf8') === digest) return;
  say('Building the client (vite build)...');
  const status = run(path.join(root, 'node_modules', '.bin', 'vite'), ['build', '--logLevel', 'warn']);
  if (status !== 0) fail('The client build failed; see the lines above.');
  fs.writeFileSync(stamp, digest);
}

/** Runs a TypeScript entry point with tsx and waits for it; exits on failure. */
export function runTs(file, args, env) {
  const status = run(path.join(root, 'node_modules', '.bin', 'tsx'), [file, ...args], { env });
  if (status !== 0) fail(`${file} ${args.join(' ')} failed.`);
}

/** Starts a long-running TypeScript process with tsx. */
export function spawnTs(file, args, env) {
  return spawn(path.join(root, 'node_modules', '.bin', 'tsx'), [file, ...args], { cwd: root, env, stdio: 'inherit' });
}
