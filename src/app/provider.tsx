import { useEffect, type ReactNode } from 'react';
import { QueryClientProvider } from '@tanstack/react-query';
import { queryClient } from '../lib/query-client';
import { onUnauthorised } from '../lib/api-client';

export function AppProvider({ children }: { children: ReactNode }) {
  // A 401 anywhere means the session ended: refresh what depends on it.
  useEffect(() => {
    const off = onUnauthorised(() => void queryClient.invalidateQueries({ queryKey: ['session'] }));
    return () => {
      off();
    };
  }, []);
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
