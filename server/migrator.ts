import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { SequelizeStorage, Umzug } from 'umzug';
import type { Sequelize } from 'sequelize';

const dir = path.join(path.dirname(fileURLToPath(import.meta.url)), 'migrations');

/** Umzug over server/migrations, recording what ran in the `migrations` table. */
export function createMigrator(sequelize: Sequelize, log: (msg: string) => void = () => {}) {
  return new Umzug({
    migrations: {
      glob: ['*.ts', { cwd: dir }],
      resolve: ({ name, path: file, context }) => ({
        name,
        up: async () => (await import(file!)).up({ context }),
        down: async () => (await import(file!)).down({ context }),
      }),
    },
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'migrations' }),
    logger: {
      info: (m) => log(`${m.event ?? ''} ${m.name ?? ''}`.trim()),
      warn: (m) => log(JSON.stringify(m)),
      error: (m) => log(JSON.stringify(m)),
      debug: () => {},
    },
  });
}
