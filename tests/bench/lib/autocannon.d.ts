// autocannon ships no types; the part of its API the load figure uses.
declare module 'autocannon' {
  interface Histogram { average: number; p50: number; p90: number; p99: number; max: number }
  interface AutocannonResult {
    latency: Histogram;
    requests: Histogram & { total: number };
    errors: number;
    timeouts: number;
    non2xx: number;
    '2xx': number;
    duration: number;
  }
  interface AutocannonOptions {
    url: string;
    connections?: number;
    duration?: number;
    headers?: Record<string, string>;
    method?: string;
    timeout?: number;
    /** Sent in turn on each connection, against `url`'s host. */
    requests?: { method?: string; path: string }[];
  }
  function autocannon(opts: AutocannonOptions): Promise<AutocannonResult>;
  export default autocannon;
}
