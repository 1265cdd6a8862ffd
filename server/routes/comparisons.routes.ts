import { z } from 'zod';
import type { Response } from 'express';
import { access, type Actor } from '../middleware/authorize';
import type { ComparisonsService } from '../services/comparisons.service';
import { comparisonInput, comparisonList, comparisonQuery, comparisonSummary, comparisonView, scalingData } from '../../shared/contracts';
import { route } from './route';

const id = z.string().uuid('This is not a comparison link.');
const userId = (res: Response) => (res.locals.actor as Actor).user.id;

export function comparisonsRoutes(svc: ComparisonsService) {
  return [
    route({
      method: 'get', path: '/api/comparisons/scaling', access: access.public,
      summary: 'Scalar statistics in SI units of the newest release of every dataset, for the scaling view', response: scalingData,
      handler: async (_req, res) => res.json(await svc.scaling()),
    }),
    route({
      method: 'get', path: '/api/comparisons/view', access: access.public,
      summary: 'An unsaved comparison of up to 12 releases (?releases=a,b): statistics side by side in SI units and overlaid curves', response: comparisonView,
      handler: async (req, res) => res.json(await svc.compare(comparisonQuery.parse(req.query).releases)),
    }),
    route({
      method: 'get', path: '/api/comparisons', access: access.signedIn,
      summary: "The caller's saved comparisons", response: comparisonList,
      handler: async (_req, res) => res.json(await svc.list(userId(res))),
    }),
    route({
      method: 'post', path: '/api/comparisons', access: access.signedIn, status: 201,
      summary: 'Saves a comparison under the caller’s account; its id is its share link', body: comparisonInput, response: comparisonSummary,
      handler: async (_req, res, body) => res.status(201).json(await svc.create(userId(res), body)),
    }),
    route({
      method: 'get', path: '/api/comparisons/:id', access: access.public,
      summary: 'A saved comparison for anyone with its link, showing only the releases whose statistics the viewer may see', response: comparisonView,
      handler: async (req, res) => res.json(await svc.get(id.parse(req.params.id), res.locals.actor?.user.id ?? null)),
    }),
    route({
      method: 'put', path: '/api/comparisons/:id', access: access.signedIn,
      summary: 'Changes the title or releases of a saved comparison (its owner only)', body: comparisonInput, response: comparisonSummary,
      handler: async (req, res, body) => res.json(await svc.update(userId(res), id.parse(req.params.id), body)),
    }),
    route({
      method: 'delete', path: '/api/comparisons/:id', access: access.signedIn, status: 204,
      summary: 'Deletes a saved comparison (its owner only)',
      handler: async (req, res) => {
        await svc.remove(userId(res), id.parse(req.params.id));
        res.status(204).end();
      },
    }),
  ];
}
