// The part of autocannon's API the benchmarks use (the package ships no types).
declare module 'autocannon' {
  namespace autocannon {
    interface Options {
      url: string;
      connections?: number;
      duration?: number;
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
      non2xx: number;
    }
  }
  function autocannon(opts: autocannon.Options): Promise<autocannon.Result>;
  export default autocannon;
}
