// The part of autocannon's API the benchmark uses (the package ships no types).
declare module "autocannon" {
  type Histogram = { average: number; p50: number; p99: number; total: number };
  type Result = { requests: Histogram; latency: Histogram; "2xx": number; non2xx: number; errors: number; timeouts: number };
  export default function autocannon(opts: { url: string; connections: number; duration: number; headers?: Record<string, string> }): Promise<Result>;
}
