import pino from 'pino';
import { env } from './env';

/**
 * Lines go to standard output without blocking the request that logs them (sonic-boom, async):
 * a synchronous write per request was a measurable part of every API answer (npm run bench). pino
 * flushes what is pending when the process exits normally; a SIGKILL can lose the last lines.
 * Nothing waits for a batch to fill: an error line on a quiet server shows at once.
 */
export const logger = pino(
  {
    level: env.LOG_LEVEL,
    redact: { paths: ['req.headers.cookie', 'req.headers["x-csrf-token"]', 'res.headers["set-cookie"]', '*.password', '*.token'], censor: '[hidden]' },
  },
  pino.destination({ dest: 1, sync: false }),
);
