import { api } from '../../../lib/api-client';
import { draftPath, useDraftMutation } from './draft-mutation';

export const publishDraft = (slug: string, draftId: string, changelog: string) =>
  api.post<{ releaseId: string; version: number; suffix: string; doi: string }>(`${draftPath(slug, draftId)}/publish`, { changelog });

export const usePublishDraft = (slug: string, draftId: string) => useDraftMutation(slug, draftId, (changelog: string) => publishDraft(slug, draftId, changelog));
