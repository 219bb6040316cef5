// The part of autocannon's programmatic API the benchmarks use.
declare module 'autocannon' {
  type Options = { url: string; connections?: number; duration?: number; headers?: Record<string, string> };
  type Result = {
    requests: { average: number; total: number };
    latency: { p50: number; p99: number };
    non2xx: number;
    errors: number;
    timeouts: number;
  };
  export default function autocannon(options: Options): Promise<Result>;
}
