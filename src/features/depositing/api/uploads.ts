import { api } from '../../../lib/api-client';
import type { StartUploadInput } from '../../../../shared/contracts';

// The four upload endpoints in one file: the uploader drives them as one flow, so they have no hooks.
const base = (slug: string, draftId: string) => `/api/labs/${encodeURIComponent(slug)}/drafts/${encodeURIComponent(draftId)}`;

export type StartedUpload = { fileId: string; fileName: string; partSize: number; partCount: number; parts: Array<{ partNumber: number; url: string }> };

export const startUpload = (slug: string, draftId: string, input: StartUploadInput) => api.post<StartedUpload>(`${base(slug, draftId)}/uploads`, input);

export const signParts = (slug: string, draftId: string, fileId: string, partNumbers: number[]) =>
  api.post<{ parts: Array<{ partNumber: number; url: string }> }>(`${base(slug, draftId)}/uploads/${fileId}/parts`, { partNumbers });

export const completeUpload = (slug: string, draftId: string, fileId: string, parts: Array<{ partNumber: number; etag: string }>) =>
  api.post<{ state: string }>(`${base(slug, draftId)}/uploads/${fileId}/complete`, { parts });

export const removeFile = (slug: string, draftId: string, fileId: string) => api.delete<void>(`${base(slug, draftId)}/files/${fileId}`);
