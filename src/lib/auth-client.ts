import { createAuthClient } from 'better-auth/react';
import { ApiRequestError } from './api-client';

/** better-auth's client for sign-up, sign-in, verification and password reset. */
export const authClient = createAuthClient({ basePath: '/api/auth' });

/** Unwraps better-auth's `{ data, error }` into our error type, so forms treat both APIs alike. */
export async function authCall<T>(p: Promise<{ data: T | null; error: { status: number; message?: string; code?: string } | null }>): Promise<T> {
  const { data, error } = await p;
  if (error) throw new ApiRequestError(error.status, error.message ?? 'Something went wrong.', (error.code ?? 'auth_error').toLowerCase());
  return data as T;
}
