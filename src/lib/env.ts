import { z } from 'zod';

// zod compiles parsers with new Function() unless told not to; our CSP forbids eval (script-src 'self').
z.config({ jitless: true });

// Checked once at start-up; a wrong build setting fails loudly, not later.
const schema = z.object({
  VITE_API_BASE: z.string().default(''),
  MODE: z.string(),
});

export const env = schema.parse(import.meta.env);
