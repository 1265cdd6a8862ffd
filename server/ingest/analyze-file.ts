import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { basename } from 'node:path';
import { analyzeStream, type AnalyzeStreamOptions, type IngestProgress } from './analyze-stream';
import type { ResultDocument } from '../../shared/engine/result-document';

/** Ingests a file from disk (1 MiB reads); see {@link analyzeStream}. */
export async function analyzeFile(
  path: string,
  options: AnalyzeStreamOptions = {},
  onProgress?: (p: IngestProgress & { totalBytes: number }) => void,
): Promise<ResultDocument> {
  const { size } = await stat(path);
  const stream = createReadStream(path, { highWaterMark: 1 << 20 });
  return analyzeStream(stream, { ...options, source: { name: basename(path), bytes: size, ...options.source } }, (p) => onProgress?.({ ...p, totalBytes: size }));
}
