// The part of autocannon's API the HTTP benchmark and the mixed-load run use (the package ships no types).
declare module 'autocannon' {
  interface Request {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
    body?: string;
    setupRequest?: (req: Request, context: Record<string, unknown>) => Request;
    onResponse?: (status: number, body: string, context: Record<string, unknown>) => void;
  }
  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    headers?: Record<string, string>;
    requests?: Request[];
  }
  interface Histogram {
    average: number;
    p50: number;
    p99: number;
    max: number;
  }
  interface Result {
    requests: Histogram & { total: number };
    latency: Histogram;
    errors: number;
    timeouts: number;
    non2xx: number;
    duration: number;
  }
  export type { Result };
  function autocannon(options: Options): Promise<Result>;
  export default autocannon;
}
