/*
 * Trajectory engine: threads, batching and the settings that bound the cost.
 *
 *   source bytes ─▶ [gzip: zlib on the libuv pool, 1 MiB output chunks, 8 MiB read-ahead]
 *                ─▶ text chunks ─▶ ParseOffload (parse-offload.ts), which starts ONE worker thread once
 *                   1 MiB has been seen (small inputs stay single-threaded):
 *                     · plain text: the first 4 MiB (and whatever arrives before the worker is up) are
 *                       parsed here by DelimitedTextParser (byte-level, fast path for plain decimal lines);
 *                       then whole-line blocks go to the worker (parseDataBlock, ≤ 4 blocks in flight; column
 *                       and text buffers go back and forth for reuse; a block is parsed here instead when the
 *                       worker is 3 blocks behind);
 *                       a block it declines (quotes, exponents, problems) is parsed here, so every
 *                       message and number is unchanged
 *                     · gzip: parsed here (zlib already occupies a second thread)
 *                ─▶ columnar batches (≈16k rows: track index, line, typed columns)
 *                ─▶ createIngest (shared/engine/ingest.ts), in this thread:
 *                     · cleanRows: units, finite positions, duplicate/order checks per track, one pass
 *                     · frame-sorted files stream straight into the FramePipeline; the first
 *                       maxReorderRows rows are also kept (the clean batches themselves, no growing copy) so
 *                       a file found out of order can still be reordered (streamed frames are then discarded
 *                       and replayed sorted)
 *                     · FramePipeline: per-track Gaussian kernels (contiguous ring per track); frames
 *                       emitted L frames later as typed-array views
 *                     · FrameStatistics: one pass per frame (centroid, radius, speed, radial bins);
 *                       moments per frame (two-pass + Pébay merge); close pairs every frame
 *                       (sort-and-sweep keeping the x-order between frames; cell list from
 *                       bruteForceBelow = 260); nearest neighbours every round(neighbourSampleInterval × fps)-th
 *                       frame, fused with the pair pass by brute force for small groups
 *                     · velocity autocorrelation, and (mode 'full') the speed and component histograms and
 *                       moments: the samples are batched (16k, whole frames, buffers handed back) to the
 *                       worker, which runs the same accumulator and adds each frame to the same histograms
 *                       and moments as this thread would; fetched after completeInput(), before end()
 *
 * Both threads run pure functions of shared/ (the worker gets their source text, no module loader).
 * Settings that trade cost for sampling (stored in the result's parameters): neighbourSampleInterval (0.04 s),
 * kinematicsCheckInterval (0.04 s: given velocities compared with kernel-derived ones on every 4th frame at 100 fps),
 * autocorrelationOriginStride (5 frames), bruteForceBelow (260).
 * Memory: the reorder store (maxReorderRows rows, ≈50 MB), ±L frames of rows, one autocorrelation ring per
 * active track, ≤ 4 parse blocks and ≤ 32 autocorrelation batches (16k samples) in flight; not the file size.
 */
import { Readable } from 'node:stream';
import { createGunzip, type ZlibOptions } from 'node:zlib';
import { createIngest, type IngestOptions } from '../../shared/engine/ingest';
import type { ResultDocument } from '../../shared/engine/result-document';
import { ParseOffload } from './parse-offload';

export interface AnalyzeStreamOptions extends IngestOptions {
  /** zlib output chunk size; large chunks keep the parser out of zlib's small-buffer cadence. Default 1 MiB. */
  gunzipChunkSize?: number;
  /**
   * Use a worker thread once the text exceeds 1 MiB: it computes the velocity autocorrelation and, for plain
   * text beyond 4 MiB, parses (gzip: the main thread parses, zlib already inflates on a second thread).
   * false: everything in this thread; 'always': parse in the worker from the first chunk (tests).
   */
  parseWorker?: boolean | 'always';
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
  let text: ParseOffload | null = null;
  const ingest = createIngest({
    ...options,
    source: { ...options.source, compression: gzip ? 'gzip' : 'none' },
    createAutocorrelation: options.createAutocorrelation ?? ((maxLag, stride, velocity) => text!.createAutocorrelation(maxLag, stride, velocity)),
  });
  const report = () => onProgress?.({ bytesIn, bytesParsed: ingest.bytesRead, rows: ingest.rowsRead });
  // gzip already inflates on a second thread (libuv pool): parsing in the worker too measured slower on two cores.
  const offload = new ParseOffload(ingest, options.parseWorker ?? !gzip, options.parseWorker !== false);
  text = offload;

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
        await offload.push(chunk);
        report();
        if (ingest.stopped) break;
      }
    await offload.finish();
    } else {
      const chunkSize = options.gunzipChunkSize ?? 1 << 20;
      // A deep readable buffer lets zlib inflate ahead (on the thread pool) while this loop parses.
      const gunzip = createGunzip({ chunkSize, highWaterMark: 8 * chunkSize } as ZlibOptions);
      const source = Readable.from(raw(), { objectMode: false });
      source.on('error', (e) => gunzip.destroy(e));
      source.pipe(gunzip);
      try {
        for await (const chunk of gunzip as AsyncIterable<Buffer>) {
          await offload.push(chunk);
          report();
          if (ingest.stopped) break;
        }
    await offload.finish();
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
    offload.close();
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
