import { useMutation, useQueryClient } from '@tanstack/react-query';
import { removeFile } from './uploads';

export function useRemoveFile(slug: string, draftId: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (fileId: string) => removeFile(slug, draftId, fileId), onSuccess: () => qc.invalidateQueries({ queryKey: ['drafts', draftId] }) });
}
