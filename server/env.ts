import { z } from 'zod';

const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  HOST: z.string().default('127.0.0.1'),
  DATABASE_URL: z.string().regex(/^postgres(ql)?:\/\//, 'DATABASE_URL must be a postgres:// URL'),
  JWT_SECRET: z.string().min(32, 'JWT_SECRET must be at least 32 characters'),
  /** Encrypts each company's signing key at rest. Losing it means new certificates; keep it with the backups. */
  SIGNING_KEY_SECRET: z.string().min(32, 'SIGNING_KEY_SECRET must be at least 32 characters'),
  APP_URL: z.string().url('APP_URL must be a URL like http://localhost:3000').default('http://localhost:3000'),
  SMTP_URL: z.string().regex(/^smtps?:\/\//, 'SMTP_URL must be an smtp:// URL').default('smtp://127.0.0.1:2525'),
  MAIL_FROM: z.string().default('Guyline <no-reply@guyline.test>'),
  /** The local fakes' own HTTP API (the mail sink's caught messages); set when the fakes run. */
  MAIL_SINK_URL: z.string().url().optional(),
  /** The token the mail sink's HTTP API asks for (npm start makes one). */
  MAIL_SINK_TOKEN: z.string().min(16, 'MAIL_SINK_TOKEN must be at least 16 characters').optional(),
  FAKES: z.enum(['on', 'off']).default('off'),
  /**
   * The demo that `npm start` runs: mail is caught by the local sink and the demo sign-ins work.
   * A production server refuses to start with the fakes on unless this says so.
   */
  GUYLINE_DEMO: z.enum(['on', 'off']).default('off'),
  /** Card payments: the processor's secret key; card payments are off without one. */
  STRIPE_SECRET_KEY: z.string().regex(/^(sk|rk)_(test|live)_/, 'STRIPE_SECRET_KEY must be an sk_test_ or sk_live_ key').optional(),
  /** Where the processor's API is: the local fake (http://127.0.0.1:2527) or empty for the real service. */
  STRIPE_API_URL: z.string().url('STRIPE_API_URL must be a URL like http://127.0.0.1:2527').optional(),
  /** The secret that signs the processor's webhook deliveries (whsec_...). */
  STRIPE_WEBHOOK_SECRET: z.string().min(8).optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  /**
   * How long a started background job may run. A job whose process died (a crash, a lost machine)
   * stays started until then; after it, another worker runs it again.
   */
  JOB_TIMEOUT_SECONDS: z.coerce.number().int().min(5).max(3600).default(600),
  /** How often pg-boss looks for such jobs and archives finished ones (shared by all processes). */
  JOB_MAINTENANCE_SECONDS: z.coerce.number().int().min(1).max(3600).default(120),
  SESSION_DAYS: z.coerce.number().int().min(1).max(90).default(14),
  /** Express's `trust proxy`: which hops may set X-Forwarded-For (a reverse proxy on this machine by default). */
  TRUST_PROXY: z.string().default('loopback'),
  /** Whether the app is reached over HTTPS (then cookies are Secure). */
  SECURE_COOKIES: z.enum(['on', 'off']).optional(),
});

export type Env = z.infer<typeof EnvSchema>;

function load(): Env {
  const parsed = EnvSchema.safeParse(process.env);
  if (!parsed.success) {
    const first = parsed.error.issues[0];
    // One clear line, then stop: a bad setting must not half-start the server.
    console.error(`Guyline cannot start: setting ${first.path.join('.')}: ${first.message}`);
    process.exit(1);
  }
  const e = parsed.data;
  if (e.NODE_ENV === 'production' && e.FAKES === 'on' && e.GUYLINE_DEMO !== 'on') {
    console.error(
      'Guyline cannot start: FAKES=on catches every e-mail and takes no real card payments; a production server runs ' +
        'with FAKES=off, or set GUYLINE_DEMO=on to run the demo (npm start does).',
    );
    process.exit(1);
  }
  return e;
}

export const env: Env = load();
export const secureCookies = env.SECURE_COOKIES ? env.SECURE_COOKIES === 'on' : env.APP_URL.startsWith('https://');
