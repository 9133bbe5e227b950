/** The part of autocannon 9's programmatic API the load benchmark uses (the package ships no types). */
declare module 'autocannon' {
  export interface AutocannonRequest {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
    body?: string;
  }

  export interface AutocannonOptions {
    url: string;
    connections?: number;
    /** Seconds. */
    duration?: number;
    /** Seconds without an answer before a request counts as a timeout (default 10). */
    timeout?: number;
    method?: string;
    headers?: Record<string, string>;
    requests?: AutocannonRequest[];
  }

  /** Percentiles as autocannon reports them: `p50`, `p90`, `p99`, ... plus average, mean, min, max. */
  export interface Histogram {
    average: number;
    mean: number;
    stddev: number;
    min: number;
    max: number;
    total: number;
    p50: number;
    p90: number;
    p99: number;
    p99_9: number;
  }

  export interface AutocannonResult {
    duration: number;
    errors: number;
    timeouts: number;
    non2xx: number;
    resets: number;
    '2xx': number;
    '4xx': number;
    '5xx': number;
    statusCodeStats: Record<string, { count: number }>;
    /** Milliseconds. */
    latency: Histogram;
    /** Requests per one-second sample; `total` is all completed requests. */
    requests: Histogram & { sent: number };
    throughput: Histogram;
  }

  function autocannon(options: AutocannonOptions): Promise<AutocannonResult>;
  export default autocannon;
}
