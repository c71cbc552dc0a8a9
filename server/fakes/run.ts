// Starts every local fake (for now the mail sink) on loopback; `npm start` and the tests run it.
import { startMailSink } from './mailSink';

const sink = await startMailSink({
  smtpPort: Number(process.env.MAIL_SINK_SMTP_PORT ?? 2525),
  httpPort: Number(process.env.MAIL_SINK_HTTP_PORT ?? 2526),
});
console.log(`[fakes] mail sink: SMTP ${sink.smtpUrl}, messages at ${sink.httpUrl}/messages`);

const stop = async () => {
  await sink.close();
  process.exit(0);
};
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
