// The part of s3rver's API the local S3 stand-in and the tests use (the package ships no types).
declare module 's3rver' {
  interface S3rverOptions {
    address?: string;
    port?: number;
    silent?: boolean;
    directory?: string;
    configureBuckets?: { name: string; configs: unknown[] }[];
    allowMismatchedSignatures?: boolean;
    resetOnClose?: boolean;
  }
  export default class S3rver {
    constructor(options: S3rverOptions);
    run(): Promise<{ address: string; port: number }>;
    close(): Promise<void>;
  }
}
