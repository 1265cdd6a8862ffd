import { z } from 'zod';

/** The one error body every API route returns. */
export const apiError = z.object({
  message: z.string(),
  code: z.string(),
  requestId: z.string(),
  fields: z.record(z.string(), z.string()).optional(),
});
export type ApiError = z.infer<typeof apiError>;
