import { api } from '../../../lib/api-client';
import { draftPath, useDraftMutation } from './draft-mutation';

export const submitDraft = (slug: string, draftId: string) => api.post<{ state: string }>(`${draftPath(slug, draftId)}/submit`);

export const useSubmitDraft = (slug: string, draftId: string) => useDraftMutation(slug, draftId, () => submitDraft(slug, draftId));
