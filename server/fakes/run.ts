// Starts every local fake (the mail sink and the card-payment fake) on loopback; `npm start` and the tests run it.
import { startMailSink } from './mailSink';
import { startCardFake } from './stripe';

/** The signing secret both sides use when STRIPE_WEBHOOK_SECRET is not set (local fake only). */
const LOCAL_WEBHOOK_SECRET = 'whsec_guyline_local_card_fake';

const sink = await startMailSink({
  smtpPort: Number(process.env.MAIL_SINK_SMTP_PORT ?? 2525),
  httpPort: Number(process.env.MAIL_SINK_HTTP_PORT ?? 2526),
  token: process.env.MAIL_SINK_TOKEN || undefined,
});
console.log(`[fakes] mail sink: SMTP ${sink.smtpUrl}, messages at ${sink.httpUrl}/messages`);

const secretKey = process.env.STRIPE_SECRET_KEY;
const webhookUrl = process.env.STRIPE_WEBHOOK_URL ?? `http://127.0.0.1:${process.env.PORT ?? 3000}/api/webhooks/stripe`;
const cardPort = Number(process.env.CARD_FAKE_PORT ?? 2527);
const card = await startCardFake({
  port: cardPort,
  webhookUrl,
  webhookSecret: process.env.STRIPE_WEBHOOK_SECRET ?? LOCAL_WEBHOOK_SECRET,
  // With a test key set, the fake takes that key only, so a wrong key shows up locally too.
  apiKey: secretKey?.startsWith('sk_test_') ? secretKey : undefined,
}).catch((err: NodeJS.ErrnoException) => {
  if (err.code !== 'EADDRINUSE') throw err;
  console.error(`[fakes] card payments: port ${cardPort} is taken; set CARD_FAKE_PORT to a free port. Card payments are off.`);
  return null;
});
if (card) {
  console.log(
    `[fakes] card payments: API and payment pages at ${card.url}, controls at ${card.url}/_fake, ` +
      `webhooks to ${webhookUrl}` +
      (process.env.STRIPE_WEBHOOK_SECRET ? '' : ` signed with the local secret ${LOCAL_WEBHOOK_SECRET}`),
  );
}

const stop = async () => {
  await Promise.all([sink.close(), card?.close()]);
  process.exit(0);
};
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
