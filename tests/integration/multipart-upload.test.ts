import { createHash, randomBytes } from 'node:crypto';
import { describe, expect, inject, it } from 'vitest';
import { createObjectStore } from '../../server/storage/object-store';
import { createMultipartUploads, PART_SIZE, partCount } from '../../server/storage/multipart-uploads';

const store = createObjectStore({ endpoint: inject('s3Endpoint'), region: 'us-east-1', bucket: 'cohesia', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' });
const uploads = createMultipartUploads(store);

describe('multipart uploads through presigned URLs (real s3rver over HTTP)', () => {
  it('uploads parts straight to the store, completes, and verifies size and SHA-256 by streaming', async () => {
    const bytes = randomBytes(PART_SIZE + 1234567);
    const key = `test/${Date.now()}/upload.bin`;
    const uploadId = await uploads.start(key, 'application/octet-stream');
    const n = partCount(bytes.length);
    expect(n).toBe(2);
    const urls = await uploads.signParts(key, uploadId, [1, 2]);
    const parts = [];
    for (const { partNumber, url } of urls) {
      const chunk = bytes.subarray((partNumber - 1) * PART_SIZE, partNumber * PART_SIZE);
      const res = await fetch(url, { method: 'PUT', body: chunk });
      expect(res.status).toBe(200);
      parts.push({ partNumber, etag: res.headers.get('etag')! });
    }
    await uploads.complete(key, uploadId, parts.reverse());
    const digest = await uploads.digest(key);
    expect(digest).toEqual({ size: bytes.length, sha256: createHash('sha256').update(bytes).digest('hex') });
    expect(await uploads.size(key)).toBe(bytes.length);

    // Downloads go through a short-lived signed URL that names the file.
    const dl = await fetch(await uploads.signDownload(key, 'swarm "A".csv'));
    expect(dl.headers.get('content-disposition')).toContain('filename="swarm _A_.csv"');
    expect(Buffer.from(await dl.arrayBuffer()).equals(bytes)).toBe(true);
  });

  it('leaves no object behind when an upload is aborted', async () => {
    const key = `test/${Date.now()}/aborted.bin`;
    const uploadId = await uploads.start(key, 'text/csv');
    const [{ url }] = await uploads.signParts(key, uploadId, [1]);
    await fetch(url, { method: 'PUT', body: Buffer.from('track_id,frame,x,y\n') });
    await uploads.abort(key, uploadId);
    expect(await uploads.size(key)).toBeNull();
  });

  it('refuses a presigned download URL once it has expired', async () => {
    const key = `test/${Date.now()}/expiring.txt`;
    const uploadId = await uploads.start(key, 'text/plain');
    const [{ url }] = await uploads.signParts(key, uploadId, [1]);
    const put = await fetch(url, { method: 'PUT', body: Buffer.from('short-lived') });
    await uploads.complete(key, uploadId, [{ partNumber: 1, etag: put.headers.get('etag')! }]);
    // The signing time is written in whole seconds (rounded down), so a link lives between
    // expiry − 1 and expiry seconds: 5 s leaves a slow machine time for the first fetch.
    const link = await uploads.signDownload(key, 'expiring.txt', 5);
    expect((await fetch(link)).status).toBe(200);
    await new Promise((r) => setTimeout(r, 6100));
    expect((await fetch(link)).status).toBe(403);
  });
});
