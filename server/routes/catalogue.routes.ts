import { access } from '../middleware/authorize';
import type { CatalogueService } from '../services/catalogue.service';
import { searchQuery, searchResult } from '../../shared/contracts';
import { route } from './route';

export function catalogueRoutes(svc: CatalogueService) {
  return [
    route({
      method: 'get', path: '/api/search', access: access.public, response: searchResult,
      summary: 'Search the catalogue: full text over released metadata, drill-down facet counts, sort, cursor pagination (one item per dataset)',
      handler: async (req, res) => res.json(await svc.search(searchQuery.parse(req.query))),
    }),
  ];
}
