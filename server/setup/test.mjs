// `npm test`: the same set-up as `npm start` (with a cluster of its own), then every test.
// Plain Node built-ins only until the dependencies are installed.
import { spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { ensureChromium, ensureClientBuild, ensureDebianPackages, ensureDependencies, root, say, startCluster } from './lib.mjs';

ensureDependencies();
const chromium = ensureChromium();
// Tools from outside the project that the document tests check PDFs with.
ensureDebianPackages({ qpdf: '/usr/bin/qpdf', 'poppler-utils': '/usr/bin/pdffonts' });
// A cluster and port of its own: tests never touch the `npm start` database and can run beside it.
// GUYLINE_TEST_CLUSTER names another cluster (a folder under .data), so two runs in one tree keep apart.
const pg = startCluster({ name: process.env.GUYLINE_TEST_CLUSTER ?? 'pg-test', port: Number(process.env.GUYLINE_TEST_PG_PORT ?? 54339), anyPort: true });

let status = 1;
try {
  // SKIP_CLIENT_BUILD=1 reuses the last build while iterating on server code (never in CI).
  if (process.env.SKIP_CLIENT_BUILD !== '1' || process.env.CI) ensureClientBuild();
  // The type check is a test too: a type error fails the run before any test starts.
  // SKIP_TYPECHECK=1 skips it while iterating on a few tests (never in CI).
  if (process.env.SKIP_TYPECHECK !== '1' || process.env.CI) {
    say('Type-checking (tsc --noEmit)...');
    const tsc = spawnSync(path.join(root, 'node_modules', '.bin', 'tsc'), ['--noEmit', '-p', 'tsconfig.json'], { cwd: root, stdio: 'inherit' });
    if (tsc.status !== 0) throw new Error('The type check failed; see the lines above.');
  }
  const report = path.join(root, '.data', 'vitest-report.json');
  const env = {
    ...process.env,
    NODE_ENV: 'test',
    DATABASE_URL: pg.url('guyline_test'),
    JWT_SECRET: randomBytes(48).toString('base64url'),
    SIGNING_KEY_SECRET: randomBytes(48).toString('base64url'),
    LOG_LEVEL: process.env.LOG_LEVEL ?? 'silent',
    FAKES: 'on',
    CHROMIUM_PATH: chromium,
  };
  const r = spawnSync(
    path.join(root, 'node_modules', '.bin', 'vitest'),
    ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...process.argv.slice(2)],
    { cwd: root, env, stdio: 'inherit' },
  );
  status = r.status ?? 1;
  if (fs.existsSync(report)) {
    const j = JSON.parse(fs.readFileSync(report, 'utf8'));
    // The plain closing line that CI reads.
    console.log(`${j.numPassedTests} passed, ${j.numFailedTests} failed` + (j.numPendingTests ? `, ${j.numPendingTests} skipped` : ''));
    if (j.numTotalTests === 0) status = status || 1;
  }
} catch (err) {
  console.error(`[guyline] ${err.message}`);
  status = 1;
} finally {
  if (pg.startedHere) pg.stop();
}
say(status === 0 ? 'All tests passed.' : 'Some tests failed.');
process.exit(status);
