declare module 's3rver' {
  type Options = {
    address?: string;
    port?: number;
    silent?: boolean;
    directory: string;
    configureBuckets?: Array<{ name: string; configs?: Array<string | Buffer> }>;
  };
  export default class S3rver {
    constructor(options: Options);
    run(): Promise<{ address: string; port: number }>;
    close(): Promise<void>;
  }
}
