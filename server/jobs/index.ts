import { getBoss } from '../services/jobs';
import { registerAccountRequests } from './accountRequests';
import { registerCardPayments } from './cardPayments';
import { registerRecognizeDeposits } from './recognizeDeposits';
import { registerReminders } from './reminders';
import { registerSendDocument } from './sendDocument';
import { registerSendMail } from './sendMail';

/** Starts this process's workers for every background queue. */
export async function startWorkers() {
  const boss = await getBoss();
  await registerSendMail(boss);
  await registerSendDocument(boss);
  await registerRecognizeDeposits(boss);
  await registerReminders(boss);
  await registerCardPayments(boss);
  await registerAccountRequests(boss);
  return boss;
}
