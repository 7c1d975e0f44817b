// s3rver (a local S3 fake, tests only) ships no types: the part the tests use.
declare module "s3rver" {
  import type { AddressInfo } from "node:net";
  export interface S3rverOptions {
    port?: number;
    address?: string;
    silent?: boolean;
    directory?: string;
    resetOnClose?: boolean;
    configureBuckets?: { name: string; configs: (string | Buffer)[] }[];
  }
  export default class S3rver {
    constructor(options?: S3rverOptions);
    run(): Promise<AddressInfo>;
    close(): Promise<void>;
  }
}
