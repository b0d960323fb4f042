/** The part of autocannon's API the server benchmarks use (the package ships no types). */
declare module 'autocannon' {
  import type { EventEmitter } from 'node:events';
  namespace autocannon {
    interface RawRequest {
      method?: string;
      path?: string;
      headers?: Record<string, string>;
      body?: string;
    }
    interface Request extends RawRequest {
      setupRequest?: (req: RawRequest, context: Record<string, unknown>) => RawRequest;
      onResponse?: (status: number, body: string, context: Record<string, unknown>) => void;
    }
    interface Options {
      url: string;
      connections?: number;
      overallRate?: number;
      duration?: number;
      headers?: Record<string, string>;
      requests?: Request[];
    }
    interface Result {
      requests: { total: number; average: number };
      latency: { p50: number; p99: number };
    }
    type Instance = EventEmitter & PromiseLike<Result>;
  }
  function autocannon(options: autocannon.Options): autocannon.Instance;
  export = autocannon;
}
