// Boot only: read settings, connect, start the workers, listen.
import { createApp } from './app';
import { sequelize } from './db';
import { env } from './env';
import { startWorkers } from './jobs';
import { logger } from './logger';
import { stopBoss } from './services/jobs';

await sequelize.authenticate();
await startWorkers();
const app = createApp({ serveClient: env.NODE_ENV === 'production' });
const server = app.listen(env.PORT, env.HOST, () => {
  logger.info(`Guyline listening on http://${env.HOST}:${env.PORT}`);
  if (env.FAKES === 'on') {
    // Said once, plainly: nothing this server mails leaves the machine.
    console.log('[guyline] Demo: e-mail is caught by the local mail sink, not delivered; each company\'s owner reads its own at /app/dev/mail.');
  }
});

async function shutdown() {
  server.close();
  await stopBoss().catch(() => {});
  await sequelize.close().catch(() => {});
  process.exit(0);
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);

// For a server started by a test run: stop when that run is gone.
if (process.env.EXIT_WITH_PARENT === '1') {
  const parent = process.ppid;
  setInterval(() => {
    try {
      process.kill(parent, 0);
    } catch {
      void shutdown();
    }
  }, 1000).unref();
}
