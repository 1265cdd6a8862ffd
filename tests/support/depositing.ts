import fs from 'node:fs';
import { expect } from 'vitest';
import type { HttpClient } from './http-client';

export const validMetadata = (overrides: Record<string, unknown> = {}) => ({
  schemaVersion: '1.0.0',
  title: 'Trapped swarm of Chironomus riparius, synthetic test recording',
  description: 'A synthetic trapped Langevin swarm used by the integration tests. Not real data.',
  creators: [{ name: 'Mina Throssel', orcid: '0000-0002-1825-0097', affiliation: { name: 'University of Harrowgate' } }],
  contact: { name: 'Mina Throssel', email: 'mina.throssel@fenmoor.example' },
  species: [{ name: 'Chironomus riparius' }],
  groupType: 'swarm',
  setting: 'laboratory',
  dimension: 3,
  units: 'm',
  frameRate: 100,
  licence: 'CC-BY-4.0',
  access: { level: 'open' },
  ...overrides,
});

/** Uploads bytes the way the browser does: start → PUT each part to its presigned URL → complete. */
export async function uploadFile(http: HttpClient, slug: string, draftId: string, fileName: string, bytes: Buffer, role = 'trajectories') {
  const start = await http.post(`/api/labs/${slug}/drafts/${draftId}/uploads`, { fileName, size: bytes.length, mediaType: fileName.endsWith('.gz') ? 'application/gzip' : 'text/csv', role });
  expect(start.status, JSON.stringify(start.json)).toBe(201);
  const { fileId, partSize, parts } = start.json as { fileId: string; partSize: number; parts: Array<{ partNumber: number; url: string }> };
  const done = [];
  for (const p of parts) {
    const res = await fetch(p.url, { method: "PUT", body: new Uint8Array(bytes.subarray((p.partNumber - 1) * partSize, p.partNumber * partSize)) });
    expect(res.status).toBe(200);
    done.push({ partNumber: p.partNumber, etag: res.headers.get('etag')! });
  }
  const complete = await http.post(`/api/labs/${slug}/drafts/${draftId}/uploads/${fileId}/complete`, { parts: done });
  expect(complete.status, JSON.stringify(complete.json)).toBe(200);
  return fileId;
}

/** Polls the draft until the file leaves the upload/ingest states. */
export async function waitForFile(http: HttpClient, slug: string, draftId: string, fileId: string, timeoutMs = 30_000) {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const draft = (await http.get(`/api/labs/${slug}/drafts/${draftId}`)).json;
    const file = draft.files.find((f: { id: string }) => f.id === fileId);
    if (file && !['uploading', 'queued', 'ingesting', 'verifying'].includes(file.state)) return file;
    if (Date.now() > until) throw new Error(`File ${fileId} still ${file?.state} after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 150));
  }
}

export const fixture = (name: string) => fs.readFileSync(new URL(`../fixtures/trajectories/${name}`, import.meta.url));
