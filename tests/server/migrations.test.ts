import { Sequelize } from 'sequelize';
import { describe, expect, it } from 'vitest';
import { ensureDatabase } from '../../server/cli';
import { createMigrator } from '../../server/migrator';

describe('migrations', () => {
  it('run up on an empty database, down to nothing, and up again', async () => {
    const url = new URL(process.env.DATABASE_URL!);
    url.pathname = `/guyline_migrations_${process.pid}`;
    await ensureDatabase(url.toString());
    const db = new Sequelize(url.toString(), { logging: false });
    try {
      const tables = async () =>
        ((await db.query(`SELECT tablename FROM pg_tables WHERE schemaname = 'public' ORDER BY 1`))[0] as { tablename: string }[]).map((r) => r.tablename);
      const migrator = createMigrator(db);
      expect((await migrator.up()).length).toBeGreaterThan(0);
      expect(await tables()).toEqual(expect.arrayContaining(['organizations', 'users', 'sessions', 'auth_tokens', 'audit_logs', 'rate_limits']));
      expect(await migrator.pending()).toHaveLength(0);
      await migrator.down({ to: 0 });
      expect(await tables()).toEqual(['migrations']);
      await migrator.up();
      expect(await tables()).toContain('users');
    } finally {
      await db.close();
      const admin = new URL(url);
      admin.pathname = '/postgres';
      const a = new Sequelize(admin.toString(), { logging: false });
      await a.query(`DROP DATABASE IF EXISTS "${url.pathname.slice(1)}" WITH (FORCE)`);
      await a.close();
    }
  });
});
