/** The parts of @20minutes/s3rver (no types of its own) that s3-server-main.ts uses. */
declare module '@20minutes/s3rver' {
  import type { AddressInfo } from 'node:net';

  interface S3rverOptions {
    address?: string;
    port?: number;
    directory?: string;
    silent?: boolean;
    vhostBuckets?: boolean;
    resetOnClose?: boolean;
    configureBuckets?: { name: string; configs?: Buffer[] }[];
  }

  class S3rver {
    constructor(options: S3rverOptions);
    run(): Promise<AddressInfo>;
    close(): Promise<void>;
  }
  export = S3rver;
}

declare module '@20minutes/s3rver/lib/models/account' {
  interface AWSAccount {
    createKeyPair(accessKeyId: string, secretAccessKey: string): void;
    revokeAccessKey(accessKeyId: string): void;
  }
  export const DUMMY_ACCOUNT: AWSAccount;
}
