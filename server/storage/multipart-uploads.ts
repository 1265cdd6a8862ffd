import { createHash } from 'node:crypto';
import zlib from 'node:zlib';
import type { Readable } from 'node:stream';
import {
  AbortMultipartUploadCommand,
  CompleteMultipartUploadCommand,
  CreateMultipartUploadCommand,
  GetObjectCommand,
  HeadObjectCommand,
  UploadPartCommand,
} from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import type { ObjectStore } from './object-store';

/** Parts of 8 MiB: above S3's 5 MiB minimum, and 1 GB is 128 parts. */
export const PART_SIZE = 8 * 1024 * 1024;
export const MAX_PARTS = 10_000;
export const PRESIGN_SECONDS = 15 * 60;

export const partCount = (size: number) => Math.max(1, Math.ceil(size / PART_SIZE));

/**
 * Browser-to-store uploads: the server starts a multipart upload and signs a
 * URL per part; the browser PUTs the bytes straight to the store; the server
 * completes the upload, then reads the object once to check size and SHA-256.
 * The API server never holds the bytes of an upload.
 */
export function createMultipartUploads(store: ObjectStore) {
  const { client, bucket } = store;
  return {
    async start(key: string, contentType: string): Promise<string> {
      const out = await client.send(new CreateMultipartUploadCommand({ Bucket: bucket, Key: key, ContentType: contentType }));
      if (!out.UploadId) throw new Error('The object store did not start the upload');
      return out.UploadId;
    },

    /** Short-lived URLs, one per part number (1-based). */
    async signParts(key: string, uploadId: string, partNumbers: number[]): Promise<Array<{ partNumber: number; url: string }>> {
      return Promise.all(
        partNumbers.map(async (partNumber) => ({
          partNumber,
          url: await getSignedUrl(client, new UploadPartCommand({ Bucket: bucket, Key: key, UploadId: uploadId, PartNumber: partNumber }), {
            expiresIn: PRESIGN_SECONDS,
          }),
        })),
      );
    },

    async complete(key: string, uploadId: string, parts: Array<{ partNumber: number; etag: string }>) {
      const sorted = [...parts].sort((a, b) => a.partNumber - b.partNumber);
      await client.send(
        new CompleteMultipartUploadCommand({
          Bucket: bucket,
          Key: key,
          UploadId: uploadId,
          MultipartUpload: { Parts: sorted.map((p) => ({ PartNumber: p.partNumber, ETag: p.etag })) },
        }),
      );
    },

    async abort(key: string, uploadId: string) {
      try {
        await client.send(new AbortMultipartUploadCommand({ Bucket: bucket, Key: key, UploadId: uploadId }));
      } catch (e) {
        // s3rver does not implement aborting; the parts it keeps never become an object.
        if ((e as { name?: string }).name !== 'MethodNotAllowed') throw e;
      }
    },

    /** Streams the stored object once: its real size and SHA-256 (hex). */
    async digest(key: string): Promise<{ size: number; sha256: string }> {
      const out = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
      const hash = createHash('sha256');
      let size = 0;
      for await (const chunk of out.Body as Readable) {
        size += (chunk as Buffer).length;
        hash.update(chunk as Buffer);
      }
      return { size, sha256: hash.digest('hex') };
    },

    /** The first lines of an object (gzip or plain), read from its first 64 KiB only. */
    async firstLines(key: string, count: number): Promise<string[]> {
      const out = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key, Range: 'bytes=0-65535' }));
      const head = Buffer.from(await out.Body!.transformToByteArray());
      // A gzip member cut short still inflates up to the cut with a sync flush.
      const text = head[0] === 0x1f && head[1] === 0x8b ? zlib.gunzipSync(head, { finishFlush: zlib.constants.Z_SYNC_FLUSH }).toString('utf8') : head.toString('utf8');
      const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
      // The last line may be cut by the 64 KiB limit.
      return lines.slice(0, Math.min(count, Math.max(1, lines.length - 1)));
    },

    async size(key: string): Promise<number | null> {
      try {
        const head = await client.send(new HeadObjectCommand({ Bucket: bucket, Key: key }));
        return Number(head.ContentLength ?? 0);
      } catch (e) {
        if ((e as { name?: string }).name === 'NotFound') return null;
        throw e;
      }
    },

    /** A short-lived download URL that names the file for the browser. */
    async signDownload(key: string, fileName: string, seconds = 300): Promise<string> {
      const safe = fileName.replace(/["\\\r\n]/g, '_');
      return getSignedUrl(
        client,
        new GetObjectCommand({
          Bucket: bucket,
          Key: key,
          ResponseContentDisposition: `attachment; filename="${safe}"; filename*=UTF-8''${encodeURIComponent(fileName)}`,
        }),
        { expiresIn: seconds },
      );
    },
  };
}

export type MultipartUploads = ReturnType<typeof createMultipartUploads>;
