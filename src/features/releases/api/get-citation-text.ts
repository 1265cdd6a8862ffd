import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { citationUrl } from './get-release';

// The BibTeX text itself, for the copy button (the same file the download link serves).
export const getCitationText = (suffix: string, format: 'bibtex' | 'ris') => api.text(citationUrl(suffix, format));

export const citationTextQueryOptions = (suffix: string, format: 'bibtex' | 'ris') =>
  queryOptions({ queryKey: ['releases', suffix, 'citation', format], queryFn: () => getCitationText(suffix, format), staleTime: Infinity });

export const useCitationText = (suffix: string, format: 'bibtex' | 'ris', enabled: boolean) => useQuery({ ...citationTextQueryOptions(suffix, format), enabled });
