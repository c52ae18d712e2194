/** The slice of autocannon 8's programmatic API the bench uses (the package ships no types). */
declare module "autocannon" {
  type Percentiles = { average: number; mean: number; stddev: number; min: number; max: number; p50: number; p90: number; p97_5: number; p99: number; total?: number };
  export type Result = {
    url: string;
    connections: number;
    duration: number;
    errors: number;
    timeouts: number;
    non2xx: number;
    "2xx": number;
    latency: Percentiles & { totalCount: number };
    requests: Percentiles & { sent: number };
    throughput: Percentiles;
  };
  export type Options = { url: string; connections?: number; duration?: number; pipelining?: number; timeout?: number; headers?: Record<string, string> };
  export default function autocannon(options: Options): PromiseLike<Result>;
}
