import type { Request, Response } from 'express';
import { access } from '../middleware/authorize';
import type { OaiService } from '../services/oai.service';
import { route } from './route';

// OAI-PMH answers XML with HTTP 200 even for protocol errors (they are inside the document).
const send = async (oai: OaiService, res: Response, args: Request['query'] | Record<string, unknown> | undefined) => {
  res.type('text/xml; charset=utf-8').send(await oai.handle((args ?? {}) as Record<string, unknown>));
};

/** `/oai`: the OAI-PMH 2.0 base URL, outside /api; public, as harvesters do not sign in. */
export function oaiRoutes(oai: OaiService) {
  return [
    route({
      method: 'get', path: '/oai', access: access.public,
      summary: 'OAI-PMH 2.0 (all six verbs, oai_dc, sets lab:<slug>, deleted records for withdrawn releases); answers text/xml',
      handler: async (req, res) => send(oai, res, req.query),
    }),
    route({
      method: 'post', path: '/oai', access: access.public,
      summary: 'OAI-PMH 2.0 with the arguments as an application/x-www-form-urlencoded body',
      handler: async (req, res) => send(oai, res, req.is('application/x-www-form-urlencoded') ? req.body : {}),
    }),
  ];
}
