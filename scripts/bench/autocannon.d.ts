// The part of autocannon's programmatic API the benchmark uses (autocannon ships no types).
declare module "autocannon" {
  interface Request {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
    body?: string;
    setupRequest?: (req: Request, context: Record<string, unknown>) => Request | null | undefined | false;
    onResponse?: (status: number, body: string, context: Record<string, unknown>, headers?: Record<string, string>) => void;
  }
  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    amount?: number;
    method?: string;
    headers?: Record<string, string>;
    body?: string;
    requests?: Request[];
    timeout?: number;
  }
  interface Result {
    requests: { total: number; average: number };
    latency: Record<string, number>;
    non2xx: number;
    errors: number;
    timeouts: number;
    duration: number;
    statusCodeStats?: Record<string, { count: number }>;
  }
  interface Instance {
    on(event: "response", fn: (client: unknown, statusCode: number, resBytes: number, responseTime: number) => void): void;
    on(event: "done", fn: (r: Result) => void): void;
    stop(): void;
  }
  function autocannon(opts: Options, cb?: (err: Error | null, result: Result) => void): Instance;
  export default autocannon;
}
