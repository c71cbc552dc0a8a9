/** Timing helpers: warm-up, interleaved runs (so a noisy moment hits both sides), medians. */

export interface Result {
  /** Short key for the README and the exit code. */
  key: string;
  figure: string;
  measured: string;
  target: string;
  /** null: the thing measured is not there yet (reported as "missing"). */
  pass: boolean | null;
  /** Extra lines for the console: raw timings, plans, files. */
  notes?: string[];
}

export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

export function percentile(xs: number[], p: number): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)];
}

export async function timed(fn: () => Promise<unknown>): Promise<number> {
  const started = performance.now();
  await fn();
  return performance.now() - started;
}

/**
 * Runs `subject` and `baseline` `runs` times each after `warmup` rounds, alternating which goes
 * first, and returns their medians in milliseconds and the ratio subject / baseline.
 */
export async function compare(
  subject: () => Promise<unknown>,
  baseline: () => Promise<unknown>,
  opts: { warmup: number; runs: number },
): Promise<{ subject: number; baseline: number; ratio: number; subjectRuns: number[]; baselineRuns: number[] }> {
  for (let i = 0; i < opts.warmup; i++) {
    await subject();
    await baseline();
  }
  const a: number[] = [];
  const b: number[] = [];
  for (let i = 0; i < opts.runs; i++) {
    if (i % 2) {
      b.push(await timed(baseline));
      a.push(await timed(subject));
    } else {
      a.push(await timed(subject));
      b.push(await timed(baseline));
    }
  }
  const subjectMs = median(a);
  const baselineMs = median(b);
  return { subject: subjectMs, baseline: baselineMs, ratio: subjectMs / baselineMs, subjectRuns: a, baselineRuns: b };
}

export const ms = (x: number) => (x >= 100 ? `${Math.round(x)} ms` : x >= 10 ? `${x.toFixed(1)} ms` : `${x.toFixed(2)} ms`);
export const times = (x: number) => `${x.toFixed(2)}×`;
