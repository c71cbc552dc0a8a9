/**
 * Password hashing and the rules for a new password. bcrypt runs in a small pool of worker
 * threads (piscina over `passwordWorker.mjs`), so a sign-up or a sign-in never holds the event
 * loop: one hash at 12 rounds is about a quarter of a second of CPU.
 */
import { availableParallelism } from 'node:os';
import Piscina from 'piscina';
import { env } from '../env';
import { badRequest, HttpError } from '../errors';

/** bcrypt's cost: 2^12 rounds (OWASP Password Storage Cheat Sheet: a work factor of 10 or more). */
export const BCRYPT_ROUNDS = 12;

/** The password of the demo's people (`npm start`); published in the README, so never valid elsewhere. */
export const DEMO_PASSWORD = 'guyline-demo';

export const demoOn = () => env.GUYLINE_DEMO === 'on';

type Task = { op: 'hash'; password: string; rounds: number } | { op: 'compare'; password: string; hash: string } | { op: 'common'; password: string };

let pool: Piscina<Task, unknown> | null = null;

function passwordPool() {
  pool ??= new Piscina<Task, unknown>({
    filename: new URL('./passwordWorker.mjs', import.meta.url).href,
    // Leave a core to the event loop where there are several; two threads at least, so one slow
    // hash never queues every sign-in behind it.
    minThreads: 1,
    maxThreads: Math.min(4, Math.max(2, availableParallelism() - 1)),
    idleTimeout: 60_000,
    // Past this many waiting hashes the answer is "busy", not a queue that grows with an attack.
    maxQueue: 200,
  });
  return pool;
}

async function run<R>(task: Task): Promise<R> {
  try {
    return (await passwordPool().run(task)) as R;
  } catch (err) {
    if (err instanceof Error && /queue is at limit/i.test(err.message)) {
      const busy = new HttpError(503, 'busy', 'Guyline is busy just now. Nothing was changed; try again in a minute.');
      (busy as HttpError & { retryAfterSeconds?: number }).retryAfterSeconds = 30;
      throw busy;
    }
    throw err;
  }
}

export function hashPassword(password: string): Promise<string> {
  // bcrypt reads only the first 72 bytes; the schemas refuse longer passwords before this.
  if (Buffer.byteLength(password, 'utf8') > 72) throw new Error('A password over 72 bytes cannot be hashed with bcrypt.');
  return run<string>({ op: 'hash', password, rounds: BCRYPT_ROUNDS });
}

let decoy: Promise<string> | null = null;

/**
 * Checks a password against a stored hash. Without a hash (no such account) it compares against a
 * decoy of the same cost, so the time taken tells nothing about whether the account exists.
 */
export async function checkPassword(password: string, hash: string | null): Promise<boolean> {
  decoy ??= run<string>({ op: 'hash', password: 'decoy-password-never-used', rounds: BCRYPT_ROUNDS });
  const ok = await run<boolean>({ op: 'compare', password, hash: hash ?? (await decoy) });
  return hash !== null && ok;
}

/** What is wrong with a password someone chooses, in words for them; null when it will do. */
export async function newPasswordProblem(password: string): Promise<string | null> {
  if (password === DEMO_PASSWORD && !demoOn()) return 'That is the demo password, which everyone knows. Choose your own.';
  if (await run<boolean>({ op: 'common', password })) return 'That password is one of the most common ones. Choose something less guessable: a few unrelated words work well.';
  return null;
}

/** Throws a 400 on `fields.password` (as the form shows it) when the chosen password will not do. */
export async function assertNewPassword(password: string) {
  const problem = await newPasswordProblem(password);
  if (problem) throw badRequest(problem, { password: problem });
}

/** Hashes a newly chosen password after checking it (the schemas have already checked its length). */
export async function hashNewPassword(password: string) {
  await assertNewPassword(password);
  return hashPassword(password);
}
