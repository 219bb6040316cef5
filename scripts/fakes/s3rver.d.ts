// s3rver ships no types; this declares only what scripts/fakes uses.
declare module 's3rver' {
  type Options = {
    address?: string;
    port?: number;
    silent?: boolean;
    directory: string;
    configureBuckets?: { name: string; configs: unknown[] }[];
  };
  export default class S3rver {
    constructor(options: Options);
    run(): Promise<{ address: string; port: number }>;
    close(): Promise<void>;
  }
}
