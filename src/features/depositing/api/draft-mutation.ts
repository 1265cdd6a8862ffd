import { useMutation, useQueryClient } from '@tanstack/react-query';

export const draftPath = (slug: string, draftId: string) => `/api/labs/${encodeURIComponent(slug)}/drafts/${encodeURIComponent(draftId)}`;

/** A review transition on a draft: refreshes the draft and the lab's lists afterwards. */
export function useDraftMutation<A, R>(slug: string, draftId: string, fn: (a: A) => Promise<R>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: ['drafts', draftId] });
      void qc.invalidateQueries({ queryKey: ['labs', slug] });
    },
  });
}
