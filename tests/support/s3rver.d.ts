declare module 's3rver' {
  import type { AddressInfo } from 'node:net';
  interface Options {
    address?: string;
    port?: number;
    silent?: boolean;
    directory?: string;
    resetOnClose?: boolean;
    configureBuckets?: { name: string; configs?: string[] }[];
  }
  export default class S3rver {
    constructor(options?: Options);
    run(): Promise<AddressInfo>;
    close(): Promise<void>;
  }
}
