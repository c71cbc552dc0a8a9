/** The benchmark company: who signs in, and what the generator builds. Shared by the generator and the figures. */
export const BENCH_COMPANY = {
  name: 'Larkspur Tent & Event Rentals',
  timeZone: 'America/Chicago',
  ownerEmail: 'owner@bench.test',
  /** Every bench user's password; the bench database is throwaway and local. */
  password: 'guyline-bench-password',
  /** Bumped when the generator changes what it builds: the bench then builds the data afresh. */
  generatorVersion: 1,
} as const;

/** The audit row that marks a finished generation (written last, in its own transaction). */
export const GENERATED_ACTION = 'bench.generated';
