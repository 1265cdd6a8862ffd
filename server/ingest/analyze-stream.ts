import { Readable } from 'node:stream';
import { createGunzip, type ZlibOptions } from 'node:zlib';
import { createIngest, type IngestOptions } from '../../shared/engine/ingest';
import type { ResultDocument } from '../../shared/engine/result-document';

export interface AnalyzeStreamOptions extends IngestOptions {
  /** zlib output chunk size; large chunks keep the parser out of zlib's small-buffer cadence. Default 1 MiB. */
  gunzipChunkSize?: number;
}

export interface IngestProgress {
  /** Bytes read from the source (compressed bytes for gzip). */
  bytesIn: number;
  /** Bytes of text parsed. */
  bytesParsed: number;
  rows: number;
}

const GZIP_MAGIC_0 = 0x1f;
const GZIP_MAGIC_1 = 0x8b;

/**
 * Ingests a trajectory file from any Readable (file, upload, object-storage
 * stream): gzip is detected by its magic bytes (not by name) and inflated on
 * the fly; text is parsed chunk by chunk; memory stays bounded by the
 * settings. Never throws for bad input: problems end up in the result's
 * validation report (status "invalid").
 */
export async function analyzeStream(
  readable: Readable,
  options: AnalyzeStreamOptions = {},
  onProgress?: (p: IngestProgress) => void,
): Promise<ResultDocument> {
  let bytesIn = 0;
  const iterator = readable[Symbol.asyncIterator]() as AsyncIterator<Buffer | string>;
  const first = await nextChunk(iterator);
  const gzip = first !== null && first.length >= 2 && first[0] === GZIP_MAGIC_0 && first[1] === GZIP_MAGIC_1;
  const ingest = createIngest({ ...options, source: { ...options.source, compression: gzip ? 'gzip' : 'none' } });
  const report = () => onProgress?.({ bytesIn, bytesParsed: ingest.bytesRead, rows: ingest.rowsRead });

  async function* raw(): AsyncGenerator<Buffer> {
    if (first === null) return;
    bytesIn += first.length;
    yield first;
    for (;;) {
      const c = await nextChunk(iterator);
      if (c === null) return;
      bytesIn += c.length;
      yield c;
    }
  }

  try {
    if (!gzip) {
      for await (const chunk of raw()) {
        ingest.push(chunk);
        report();
        if (ingest.stopped) break;
      }
    } else {
      const chunkSize = options.gunzipChunkSize ?? 1 << 20;
      // A deep readable buffer lets zlib inflate ahead (on the thread pool) while this loop parses.
      const gunzip = createGunzip({ chunkSize, highWaterMark: 8 * chunkSize } as ZlibOptions);
      const source = Readable.from(raw(), { objectMode: false });
      source.on('error', (e) => gunzip.destroy(e));
      source.pipe(gunzip);
      try {
        for await (const chunk of gunzip as AsyncIterable<Buffer>) {
          ingest.push(chunk);
          report();
          if (ingest.stopped) break;
        }
      } catch (e) {
        const msg = (e as Error).message;
        if (!ingest.stopped) {
          ingest.fail(
            'corrupt-gzip',
            `The file is gzip-compressed but cannot be decompressed (${msg.replace(/\.$/, '')}) after ${ingest.bytesRead.toLocaleString('en-US')} bytes of text: it is truncated or damaged. Compress it again, or upload the plain CSV.`,
          );
        }
      } finally {
        source.unpipe(gunzip);
        source.destroy();
        gunzip.destroy();
      }
    }
  } catch (e) {
    ingest.fail('read-failed', `The file could not be read: ${(e as Error).message}.`);
  } finally {
    if (iterator.return) await iterator.return().catch(() => undefined);
  }
  report();
  return ingest.end();
}

async function nextChunk(it: AsyncIterator<Buffer | string>): Promise<Buffer | null> {
  const r = await it.next();
  if (r.done) return null;
  return typeof r.value === 'string' ? Buffer.from(r.value) : r.value;
}
