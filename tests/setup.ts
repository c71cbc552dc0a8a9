import { afterAll, inject } from 'vitest';

// Point every test file's server code at the mail sink and app that globalSetup started,
// before any server module reads its settings.
process.env.SMTP_URL = inject('smtpUrl');
process.env.MAIL_SINK_URL = inject('mailSinkUrl');
process.env.MAIL_SINK_TOKEN = inject('mailSinkToken');
process.env.APP_URL = inject('appUrl');
process.env.FAKES = 'on';
process.env.STRIPE_SECRET_KEY = inject('stripeSecretKey');
process.env.STRIPE_API_URL = inject('cardFakeUrl');
process.env.STRIPE_WEBHOOK_SECRET = inject('stripeWebhookSecret');

afterAll(async () => {
  const { stopBoss } = await import('../server/services/jobs');
  const { sequelize } = await import('../server/db');
  await stopBoss();
  await sequelize.close();
});
