// archiver 8 ships without type declarations; this covers what the bundle builder uses.
declare module 'archiver' {
  import type { Readable, Transform } from 'node:stream';
  export class ZipArchive extends Transform {
    constructor(options?: { zlib?: { level?: number }; forceZip64?: boolean });
    append(source: Readable | Buffer | string, data: { name: string; store?: boolean; date?: Date }): this;
    finalize(): Promise<void>;
    pointer(): number;
    abort(): this;
  }
}
