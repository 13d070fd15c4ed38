// The part of autocannon's API the benchmarks use (the package ships no types).
declare module 'autocannon' {
  namespace autocannon {
    interface Options {
      url: string;
      connections?: number;
      duration?: number;
      headers?: Record<string, string>;
    }
    interface Histogram {
      p50: number;
      p99: number;
      average: number;
      max: number;
    }
    interface Result {
      latency: Histogram;
      requests: { total: number; average: number };
      errors: number;
      timeouts: number;
      non2xx: number;
    }
    interface Instance extends PromiseLike<Result> {
      on(event: 'response', cb: (client: unknown, statusCode: number, resBytes: number, responseTimeMs: number) => void): Instance;
    }
  }
  function autocannon(opts: autocannon.Options): autocannon.Instance;
  export default autocannon;
}
