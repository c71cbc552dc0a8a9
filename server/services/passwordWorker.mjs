// Runs in a worker thread of server/services/passwords.ts: bcrypt is CPU work that would otherwise
// hold the event loop for a quarter of a second per hash, and unpacking the common-password list
// takes about as long once. Plain JavaScript, so the thread needs no TypeScript loader (the same
// file runs under tsx, vitest and node).
import bcrypt from 'bcryptjs';

/** @type {Set<string> | null} */
let common = null;

async function isCommon(password) {
  if (!common) {
    // The `passwords-common` dictionary of @zxcvbn-ts/language-common (4.1.x): the list of common
    // passwords that the zxcvbn-ts strength estimator ships, about 49,000 entries, lowercase.
    const { dictionary } = await import('@zxcvbn-ts/language-common');
    common = new Set(dictionary['passwords-common']);
  }
  return common.has(password.toLowerCase());
}

/**
 * @param {{ op: 'hash', password: string, rounds: number }
 *   | { op: 'compare', password: string, hash: string }
 *   | { op: 'common', password: string }} task
 */
export default async function run(task) {
  if (task.op === 'hash') return bcrypt.hashSync(task.password, task.rounds);
  if (task.op === 'compare') return bcrypt.compareSync(task.password, task.hash);
  if (task.op === 'common') return isCommon(task.password);
  throw new Error(`Unknown password task ${String(task.op)}`);
}
