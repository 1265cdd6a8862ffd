import type { Response } from 'express';
import { access } from '../middleware/authorize';
import { auditPage, auditQuery } from '../../shared/contracts';
import type { AuditScope, AuditService } from '../services/audit.service';
import { route } from './route';

// The lab's whole log (terms, grants, embargoes, every curator's decisions) is the lead's, who
// holds `lab: update`; curators already see each request's own history. Admins may read any lab's.
const labLog = access.labOrAdmin({ lab: ['update'] });

function sendCsv(res: Response, name: string, body: string) {
  res.type('text/csv; charset=utf-8');
  res.attachment(`${name}-${new Date().toISOString().slice(0, 10)}.csv`);
  // A byte-order mark so spreadsheets read the file as UTF-8.
  res.send(`\uFEFF${body}`);
}

export function auditRoutes(svc: AuditService) {
  const labScope = (res: Response): AuditScope => ({ labId: res.locals.lab!.id });
  return [
    route({
      method: 'get', path: '/api/labs/:slug/audit', access: labLog, response: auditPage,
      summary: "The lab's audit log, newest first: filter by action, actor, target and date range (cursor pagination)",
      handler: async (req, res) => res.json(await svc.page(labScope(res), auditQuery.parse(req.query))),
    }),
    route({
      method: 'get', path: '/api/labs/:slug/audit/export', access: labLog,
      summary: "The lab's audit log with the same filters, as CSV",
      handler: async (req, res) => sendCsv(res, `audit-${res.locals.lab!.slug}`, await svc.csv(labScope(res), auditQuery.parse(req.query))),
    }),
    route({
      method: 'get', path: '/api/admin/audit', access: access.admin, response: auditPage,
      summary: "The whole platform's audit log, newest first, with the same filters (cursor pagination)",
      handler: async (req, res) => res.json(await svc.page({ all: true }, auditQuery.parse(req.query))),
    }),
    route({
      method: 'get', path: '/api/admin/audit/export', access: access.admin,
      summary: "The whole platform's audit log with the same filters, as CSV",
      handler: async (req, res) => sendCsv(res, 'audit-all', await svc.csv({ all: true }, auditQuery.parse(req.query))),
    }),
  ];
}
