import { getBoss } from '../services/jobs';
import { registerRecognizeDeposits } from './recognizeDeposits';
import { registerSendDocument } from './sendDocument';
import { registerSendMail } from './sendMail';

/** Starts this process's workers for every background queue. */
export async function startWorkers() {
  const boss = await getBoss();
  await registerSendMail(boss);
  await registerSendDocument(boss);
  await registerRecognizeDeposits(boss);
  return boss;
}
