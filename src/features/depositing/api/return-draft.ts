import { api } from '../../../lib/api-client';
import { draftPath, useDraftMutation } from './draft-mutation';

export const returnDraft = (slug: string, draftId: string, body: string) => api.post<{ state: string }>(`${draftPath(slug, draftId)}/return`, { body });

export const useReturnDraft = (slug: string, draftId: string) => useDraftMutation(slug, draftId, (body: string) => returnDraft(slug, draftId, body));
