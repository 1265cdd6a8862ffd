import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type ReviewItem = { draftId: string; datasetId: string; title: string; doi: string; submittedAt: string | null; newVersion: boolean };

export const getReviewQueue = (slug: string) => api.get<ReviewItem[]>(`/api/labs/${encodeURIComponent(slug)}/review-queue`);
export const reviewQueueQueryOptions = (slug: string) => queryOptions({ queryKey: ['labs', slug, 'review-queue'], queryFn: () => getReviewQueue(slug) });
export const useReviewQueue = (slug: string, enabled = true) => useQuery({ ...reviewQueueQueryOptions(slug), enabled });
