import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { Profile, UpdateProfileInput } from '../../../../shared/contracts';

export const updateProfile = (input: UpdateProfileInput) => api.patch<Profile>('/api/me', input);

export function useUpdateProfile() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateProfile,
    onSuccess: (p) => {
      qc.setQueryData(['me'], p);
      void qc.invalidateQueries({ queryKey: ['session'] });
    },
  });
}
