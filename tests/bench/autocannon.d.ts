// The part of autocannon's API the benchmarks use (the package ships no types).
declare module 'autocannon' {
  import type { EventEmitter } from 'node:events';

  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    amount?: number;
    requests?: Array<{
      method?: string;
      path: string;
      headers?: Record<string, string>;
      setupRequest?: (req: { path: string }) => { path: string };
    }>;
  }

  interface Result {
    duration: number;
    requests: { total: number; average: number };
    throughput: { total: number };
    latency: Record<string, number>;
    non2xx: number;
    errors: number;
    timeouts: number;
  }

  type Instance = EventEmitter & PromiseLike<Result>;

  function autocannon(options: Options): Instance;
  export default autocannon;
}
