// s3rver ships no type definitions; these cover the parts the embedded starter uses.
declare module 's3rver' {
  import type { Server } from 'node:http';
  import type { AddressInfo } from 'node:net';

  interface S3rverOptions {
    address?: string;
    port?: number;
    silent?: boolean;
    directory: string;
    resetOnClose?: boolean;
    allowMismatchedSignatures?: boolean;
    vhostBuckets?: boolean;
    configureBuckets?: { name: string; configs?: (string | Buffer)[] }[];
  }

  export default class S3rver {
    constructor(options: S3rverOptions);
    httpServer?: Server;
    run(): Promise<AddressInfo>;
    close(): Promise<void>;
  }
}
