import type { Request, Response } from 'express';
import type { z } from 'zod';
import type { Access } from '../middleware/authorize';

/**
 * One API route: its path, who may call it, the zod schema of its body (parsed
 * before the handler runs) and of its answer (for the OpenAPI description).
 */
export type Route<B extends z.ZodType = z.ZodType> = {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  path: string;
  access: Access;
  summary: string;
  body?: B;
  response?: z.ZodType;
  // 2xx status when it is not 200.
  status?: number;
  handler: (req: Request, res: Response, body: z.output<B>) => Promise<unknown>;
};

export const route = <B extends z.ZodType = z.ZodType>(r: Route<B>) => r as unknown as Route;
