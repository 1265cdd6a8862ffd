import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo } from '../support/accounts';
import { waitForFile } from '../support/depositing';

let app: TestApp;
beforeAll(async () => {
  // A lab's free tier is 1 GB by default; this test needs a little more.
  app = await startTestApp({ env: { FREE_TIER_BYTES: String(2 * 1000 ** 3) } });
});
afterAll(async () => app?.close());

describe('a 1 GB upload', () => {
  it('goes straight to the object store in parts and is verified by one streaming read', async () => {
    const http = await signInDemo(app, 'jun.haverly@tidewater.example');
    const { draftId } = (await http.post('/api/labs/tidewater-schooling/datasets', { title: 'Large upload test', summary: '' })).json;
    const size = 1024 ** 3;
    const start = await http.post(`/api/labs/tidewater-schooling/drafts/${draftId}/uploads`, { fileName: 'video-frames.bin', size, mediaType: 'application/octet-stream', role: 'supplementary' });
    expect(start.status).toBe(201);
    const { fileId, partSize, partCount } = start.json;
    expect(partCount).toBe(128);
    // Deterministic bytes made part by part, so the test never holds the whole file either.
    const hash = createHash('sha256');
    const parts: Array<{ partNumber: number; etag: string }> = [];
    let urls = new Map<number, string>(start.json.parts.map((p: { partNumber: number; url: string }) => [p.partNumber, p.url]));
    for (let n = 1; n <= partCount; n++) {
      if (!urls.has(n)) {
        const more = await http.post(`/api/labs/tidewater-schooling/drafts/${draftId}/uploads/${fileId}/parts`, { partNumbers: [n] });
        urls = new Map(more.json.parts.map((p: { partNumber: number; url: string }) => [p.partNumber, p.url]));
      }
      const chunk = Buffer.alloc(Math.min(partSize, size - (n - 1) * partSize), n % 251);
      hash.update(chunk);
      const res = await fetch(urls.get(n)!, { method: 'PUT', body: new Uint8Array(chunk) });
      expect(res.status).toBe(200);
      parts.push({ partNumber: n, etag: res.headers.get('etag')! });
    }
    expect((await http.post(`/api/labs/tidewater-schooling/drafts/${draftId}/uploads/${fileId}/complete`, { parts })).status).toBe(200);
    const file = await waitForFile(http, 'tidewater-schooling', draftId, fileId, 120_000);
    expect(file).toMatchObject({ state: 'stored', sizeBytes: size, sha256: hash.digest('hex') });
  }, 240_000);
});
