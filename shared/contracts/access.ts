import { z } from 'zod';

export const requestAccessInput = z.object({
  purpose: z.string().trim().min(20, 'Say in a sentence or two what you will use the data for (at least 20 characters)').max(2000, 'Keep it under 2,000 characters'),
  affiliation: z.string().trim().min(2, 'Give your institution or organisation').max(300),
  scope: z.enum(['release', 'dataset']).default('release'),
  termsVersion: z.number().int().min(1),
  acceptTerms: z.literal(true, { error: 'You need to accept the data-use terms to send the request' }),
});
export type RequestAccessInput = z.input<typeof requestAccessInput>;

export const decideAccessInput = z
  .object({
    decision: z.enum(['approve', 'deny']),
    expiresOn: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2027-06-30').optional().or(z.literal('')),
    note: z.string().trim().max(2000).default(''),
  })
  .refine((v) => v.decision === 'approve' || v.note.length >= 5, { message: 'Tell the requester why (at least 5 characters)', path: ['note'] });
export type DecideAccessInput = z.input<typeof decideAccessInput>;

export const termsInput = z.object({ body: z.string().trim().min(20, 'Write the terms in at least 20 characters').max(20000) });

export type AccessRequestView = {
  id: string;
  state: 'pending' | 'approved' | 'denied' | 'withdrawn';
  scope: 'release' | 'dataset';
  release: { suffix: string; title: string; version: number } | null;
  dataset: { suffix: string; title: string };
  requester: { name: string; email: string | null };
  purpose: string;
  affiliation: string;
  termsVersion: number;
  createdAt: string;
  decidedAt: string | null;
  decisionNote: string | null;
  grant: { id: string; expiresAt: string | null; revokedAt: string | null; status: 'active' | 'expired' | 'revoked' } | null;
};

export const createTokenInput = z.object({
  name: z.string().trim().min(2, 'Name the token after the script that uses it').max(100),
  scopes: z.array(z.enum(['read', 'deposit'])).min(1).default(['read']),
});
export type CreateTokenInput = z.input<typeof createTokenInput>;
export type ApiTokenView = { id: string; name: string; prefix: string; scopes: string[]; createdAt: string; lastUsedAt: string | null; revokedAt: string | null };
