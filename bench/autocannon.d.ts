// The part of autocannon 9's API the load bench uses (the package ships no types).
declare module 'autocannon' {
  import type { EventEmitter } from 'node:events';
  interface Request {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
    setupRequest?: (req: Request) => Request;
  }
  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    overallRate?: number;
    headers?: Record<string, string>;
    requests?: Request[];
    timeout?: number;
  }
  interface Result {
    requests: { total: number };
    errors: number;
    timeouts: number;
    non2xx: number;
  }
  interface Instance extends EventEmitter, PromiseLike<Result> {
    stop(): void;
  }
  function autocannon(opts: Options): Instance;
  export default autocannon;
}
