import { expect } from 'vitest';
import type { HttpClient } from './http-client';
import { fixture, uploadFile, validMetadata, waitForFile } from './depositing';

export type Published = { datasetId: string; releaseId: string; suffix: string; doi: string; version: number };

/** Deposits one synthetic trajectory file and publishes it, the way the browser does it (create → upload → submit → publish). */
export async function publishRelease(depositor: HttpClient, publisher: HttpClient, lab: string, metadata: Record<string, unknown>): Promise<Published> {
  const title = String(metadata.title);
  const created = await depositor.post(`/api/labs/${lab}/datasets`, { title, summary: '' });
  expect(created.status).toBe(201);
  const { draftId, datasetId } = created.json as { draftId: string; datasetId: string };
  await depositor.put(`/api/labs/${lab}/drafts/${draftId}/metadata`, { metadata: validMetadata({ frameRate: 25, ...metadata }) });
  await waitForFile(depositor, lab, draftId, await uploadFile(depositor, lab, draftId, 'flock.csv.gz', fixture('vicsek-flock-3d.csv.gz')));
  expect((await depositor.post(`/api/labs/${lab}/drafts/${draftId}/submit`)).status).toBe(200);
  const published = await publisher.post(`/api/labs/${lab}/drafts/${draftId}/publish`, {});
  expect(published.status).toBe(201);
  return { datasetId, ...(published.json as Omit<Published, 'datasetId'>) };
}

/** Publishes the next version of a dataset with the files carried over. */
export async function publishNewVersion(depositor: HttpClient, publisher: HttpClient, lab: string, datasetId: string, changelog: string): Promise<Published> {
  const next = await depositor.post(`/api/labs/${lab}/datasets/${datasetId}/versions`);
  expect(next.status).toBe(201);
  expect((await depositor.post(`/api/labs/${lab}/drafts/${next.json.draftId}/submit`)).status).toBe(200);
  const published = await publisher.post(`/api/labs/${lab}/drafts/${next.json.draftId}/publish`, { changelog });
  expect(published.status).toBe(201);
  return { datasetId, ...(published.json as Omit<Published, 'datasetId'>) };
}
