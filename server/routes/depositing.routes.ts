import { z } from 'zod';
import type { Response } from 'express';
import { access, type Actor as AuthActor } from '../middleware/authorize';
import type { DepositingService } from '../services/depositing.service';
import {
  commentInput,
  completeUploadInput,
  createDatasetInput,
  ingestOptionsInput,
  publishInput,
  returnDraftInput,
  saveMetadataInput,
  signPartsInput,
  startUploadInput,
} from '../../shared/contracts';
import { route } from './route';

const actorOf = (res: Response) => {
  const a = res.locals.actor as AuthActor;
  return { id: a.user.id, name: a.user.name, email: a.user.email };
};
const id = z.string().min(1).max(100);
const canRead = access.lab({ lab: ['read-members'] });
const canEdit = access.lab({ dataset: ['edit'] });

export function depositingRoutes(svc: DepositingService) {
  return [
    route({
      method: 'get', path: '/api/labs/:slug/datasets', access: canRead, summary: "The lab's datasets with their open draft and latest version",
      handler: async (_req, res) => res.json(await svc.listDatasets(res.locals.lab!)),
    }),
    route({
      method: 'post', path: '/api/labs/:slug/datasets', access: access.lab({ dataset: ['create'] }), summary: 'Create a dataset and its first draft',
      body: createDatasetInput, status: 201,
      handler: async (_req, res, body) => res.status(201).json(await svc.createDataset(actorOf(res), res.locals.lab!, body)),
    }),
    route({
      method: 'get', path: '/api/labs/:slug/downloads', access: canRead, summary: "Downloads of the lab's releases per month",
      handler: async (_req, res) => res.json(await svc.downloadsByMonth(res.locals.lab!)),
    }),
    route({
      method: 'get', path: '/api/labs/:slug/review-queue', access: access.lab({ release: ['review'] }), summary: 'Drafts submitted for review, oldest first',
      handler: async (_req, res) => res.json(await svc.reviewQueue(res.locals.lab!)),
    }),
    route({
      method: 'post', path: '/api/labs/:slug/datasets/:id/versions', access: access.lab({ dataset: ['create'] }), summary: 'Start a new version: a draft from the latest release',
      status: 201,
      handler: async (req, res) => res.status(201).json(await svc.newVersion(actorOf(res), res.locals.lab!, id.parse(req.params.id))),
    }),
    route({
      method: 'get', path: '/api/labs/:slug/drafts/:id', access: canRead, summary: 'A draft: metadata with its problems, files with ingest progress, comments',
      handler: async (req, res) => res.json(await svc.draft(res.locals.lab!, id.parse(req.params.id))),
    }),
    route({
      method: 'put', path: '/api/labs/:slug/drafts/:id/metadata', access: canEdit, summary: 'Save the metadata (autosave; returns the problems left)',
      body: saveMetadataInput.extend({ changelog: z.string().max(5000).optional() }),
      handler: async (req, res, body) => res.json(await svc.saveMetadata(res.locals.lab!, id.parse(req.params.id), body.metadata, body.changelog)),
    }),
    route({
      method: 'post', path: '/api/labs/:slug/drafts/:id/uploads', access: canEdit, summary: 'Start a direct upload: reserves quota and returns presigned part URLs',
      body: startUploadInput, status: 201,
      handler: async (req, res, body) => res.status(201).json(await svc.startUpload(actorOf(res), res.locals.lab!, id.parse(req.params.id), body)),
    }),
    route({
      method: 'post', path: '/api/labs/:slug/drafts/:id/uploads/:fileId/parts', access: canEdit, summary: 'Fresh presigned URLs for some parts (resume, retry)',
      body: signPartsInput,
      handler: async (req, res, body) => res.json(await svc.signParts(res.locals.lab!, id.parse(req.params.id), id.parse(req.params.fileId), body.partNumbers)),
    }),
    route({
      method: 'post', path: '/api/labs/:slug/drafts/:id/uploads/:fileId/complete', access: canEdit, summary: 'Finish an upload; the file is then verified and ingested in the background',
      body: completeUploadInput,
      handler: async (req, res, body) => res.json(await svc.completeUpload(res.locals.lab!, id.parse(req.params.id), id.parse(req.params.fileId), body.parts)),
    }),
    route({
      method: 'get', path: '/api/labs/:slug/drafts/:id/files/:fileId', access: canRead, summary: "A file's ingest report (validation, statistics, plots, quick look)",
      handler: async (req, res) => res.json(await svc.fileDetail(res.locals.lab!, id.parse(req.params.id), id.parse(req.params.fileId))),
    }),
    route({
      method: 'get', path: '/api/labs/:slug/drafts/:id/files/:fileId/preview', access: canRead, summary: 'The first lines of a file, for mapping its columns',
      handler: async (req, res) => res.json(await svc.preview(res.locals.lab!, id.parse(req.params.id), id.parse(req.params.fileId))),
    }),
    route({
      method: 'post', path: '/api/labs/:slug/drafts/:id/files/:fileId/ingest', access: canEdit, summary: 'Check a file again with a column mapping and units',
      body: ingestOptionsInput,
      handler: async (req, res, body) => res.json(await svc.reingest(res.locals.lab!, id.parse(req.params.id), id.parse(req.params.fileId), body)),
    }),
    route({
      method: 'delete', path: '/api/labs/:slug/drafts/:id/files/:fileId', access: canEdit, summary: 'Cancel an upload or remove a file from the draft', status: 204,
      handler: async (req, res) => {
        await svc.removeFile(res.locals.lab!, id.parse(req.params.id), id.parse(req.params.fileId));
        res.status(204).end();
      },
    }),
    route({
      method: 'post', path: '/api/labs/:slug/drafts/:id/comments', access: canRead, summary: 'Comment on a draft', body: commentInput, status: 201,
      handler: async (req, res, body) => {
        await svc.comment(actorOf(res), res.locals.lab!, id.parse(req.params.id), body.body);
        res.status(201).json({ ok: true });
      },
    }),
    route({
      method: 'post', path: '/api/labs/:slug/drafts/:id/submit', access: canEdit, summary: 'Submit a draft for review (e-mails the curators)',
      handler: async (req, res) => res.json(await svc.submit(actorOf(res), res.locals.lab!, id.parse(req.params.id))),
    }),
    route({
      method: 'post', path: '/api/labs/:slug/drafts/:id/return', access: access.lab({ release: ['review'] }), summary: 'Return a submitted draft with a comment (e-mails the depositor)',
      body: returnDraftInput,
      handler: async (req, res, body) => res.json(await svc.returnDraft(actorOf(res), res.locals.lab!, id.parse(req.params.id), body.body)),
    }),
    route({
      method: 'post', path: '/api/labs/:slug/drafts/:id/publish', access: access.lab({ release: ['publish'] }), summary: 'Publish a submitted draft as an immutable release with its identifier',
      body: publishInput, status: 201,
      handler: async (req, res, body) => res.status(201).json(await svc.publish(actorOf(res), res.locals.lab!, id.parse(req.params.id), body.changelog)),
    }),
  ];
}
