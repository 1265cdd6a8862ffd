import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { Transform, type Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';

/** Streams `source` into `file` (parents made), returning its size and SHA-256; memory stays bounded. */
export async function writeHashed(source: Readable, file: string): Promise<{ sizeBytes: number; sha256: string }> {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const hash = createHash('sha256');
  let sizeBytes = 0;
  const tap = new Transform({
    transform(chunk: Buffer, _enc, done) {
      hash.update(chunk);
      sizeBytes += chunk.length;
      done(null, chunk);
    },
  });
  await pipeline(source, tap, fs.createWriteStream(file));
  return { sizeBytes, sha256: hash.digest('hex') };
}

export async function hashFile(file: string): Promise<{ sizeBytes: number; sha256: string }> {
  const hash = createHash('sha256');
  let sizeBytes = 0;
  for await (const chunk of fs.createReadStream(file)) {
    hash.update(chunk as Buffer);
    sizeBytes += (chunk as Buffer).length;
  }
  return { sizeBytes, sha256: hash.digest('hex') };
}
