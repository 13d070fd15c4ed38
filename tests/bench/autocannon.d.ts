// The part of autocannon's API the load benchmark uses (the package ships no types).
declare module 'autocannon' {
  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    headers?: Record<string, string>;
  }
  interface Result {
    errors: number;
    timeouts: number;
    non2xx: number;
    requests: { average: number; total: number };
  }
  interface Instance extends PromiseLike<Result> {
    on(event: 'response', cb: (client: unknown, statusCode: number, resBytes: number, responseTimeMs: number) => void): Instance;
  }
  function autocannon(opts: Options): Instance;
  export default autocannon;
}
