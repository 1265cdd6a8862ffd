import { z } from 'zod';

// Shared by the forms and, where our own routes take them, the server.
export const email = z.string().trim().toLowerCase().email('Enter a valid e-mail address').max(254);
export const password = z
  .string()
  .min(10, 'Use at least 10 characters')
  .max(128, 'Use at most 128 characters');

export const signUpInput = z.object({
  name: z.string().trim().min(2, 'Enter your name as it should appear in citations').max(120),
  email,
  password,
});
export type SignUpInput = z.infer<typeof signUpInput>;

export const signInInput = z.object({ email, password: z.string().min(1, 'Enter your password') });
export type SignInInput = z.infer<typeof signInInput>;

export const forgotPasswordInput = z.object({ email });
export const resetPasswordInput = z
  .object({ password, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { message: 'The two passwords differ', path: ['confirm'] });
