// Maintenance commands: `tsx server/cli.ts setup|migrate|rollback|seed`.
import pg from 'pg';
import { sequelize } from './db';
import { env } from './env';
import { createMigrator } from './migrator';
import { getBoss, stopBoss } from './services/jobs';
import { seedDemo } from './seed/demo';

/** Creates the database named in DATABASE_URL when it does not exist yet. */
export async function ensureDatabase(url = env.DATABASE_URL) {
  const target = new URL(url);
  const name = decodeURIComponent(target.pathname.slice(1));
  const admin = new URL(url);
  admin.pathname = '/postgres';
  const client = new pg.Client({ connectionString: admin.toString() });
  await client.connect();
  try {
    const { rowCount } = await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [name]);
    if (!rowCount) await client.query(`CREATE DATABASE "${name.replace(/"/g, '""')}"`);
  } finally {
    await client.end();
  }
}

export async function migrate(log = (m: string) => console.log(`[migrate] ${m}`)) {
  const migrator = createMigrator(sequelize, log);
  const done = await migrator.up();
  // pg-boss keeps its own tables in the `pgboss` schema; starting it once installs or upgrades them.
  await getBoss();
  await stopBoss();
  return done;
}

async function main() {
  const command = process.argv[2];
  switch (command) {
    case 'setup': {
      await ensureDatabase();
      const done = await migrate();
      console.log(`[setup] ${done.length} migration(s) applied.`);
      if (await seedDemo()) console.log('[setup] Demo company loaded.');
      break;
    }
    case 'migrate':
      await ensureDatabase();
      await migrate();
      break;
    case 'rollback':
      await createMigrator(sequelize, console.log).down();
      break;
    case 'seed':
      console.log((await seedDemo()) ? 'Demo company loaded.' : 'Demo company already present.');
      break;
    default:
      console.error('usage: tsx server/cli.ts setup|migrate|rollback|seed');
      process.exitCode = 2;
  }
  await sequelize.close();
}

if (process.argv[1]?.endsWith('cli.ts')) await main();
