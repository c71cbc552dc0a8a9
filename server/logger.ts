import pino from 'pino';
import { env } from './env';

/**
 * Lines go to standard output without blocking the request that logs them (sonic-boom, async):
 * a synchronous write per request was a measurable part of every API answer (npm run bench). pino
 * flushes what is buffered when the process exits normally; a SIGKILL can lose the last lines.
 */
export const logger = pino(
  {
    level: env.LOG_LEVEL,
    redact: { paths: ['req.headers.cookie', 'req.headers["x-csrf-token"]', 'res.headers["set-cookie"]', '*.password', '*.token'], censor: '[hidden]' },
  },
  // In production lines are also gathered up to 4 kB a write (fewer system calls); in development each shows at once.
  pino.destination({ dest: 1, sync: false, minLength: env.NODE_ENV === 'production' ? 4096 : 0 }),
);
