import { api } from '../../../lib/api-client';
import { draftPath, useDraftMutation } from './draft-mutation';

export const commentOnDraft = (slug: string, draftId: string, body: string) => api.post<{ ok: true }>(`${draftPath(slug, draftId)}/comments`, { body });

export const useCommentOnDraft = (slug: string, draftId: string) => useDraftMutation(slug, draftId, (body: string) => commentOnDraft(slug, draftId, body));
