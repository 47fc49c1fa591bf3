// The little of s3rver 3.7 (CommonJS, no types of its own) the tests use: an S3-compatible server in-process.
declare module "s3rver" {
  interface S3rverOptions {
    address?: string;
    /** 0: any free port (run() answers the one chosen). */
    port?: number;
    silent?: boolean;
    /** Buckets and objects are kept as files here. */
    directory: string;
    configureBuckets?: { name: string; configs?: Buffer[] }[];
    resetOnClose?: boolean;
  }
  export default class S3rver {
    constructor(options: S3rverOptions);
    run(): Promise<{ address: string; port: number }>;
    close(): Promise<void>;
  }
}
