import type { Request, Response } from 'express';
import type { Access } from '../middleware/authorize';

/** One API route: its path, who may call it, and a thin handler (parse → service → JSON). */
export type Route = {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  path: string;
  access: Access;
  summary: string;
  handler: (req: Request, res: Response) => Promise<unknown>;
};

export const route = (r: Route) => r;
