import { randomUUID } from 'node:crypto';
import { DeleteObjectCommand } from '@aws-sdk/client-s3';
import type { Logger } from 'pino';
import { AppError, notFound } from '../errors';
import type { DepositingRepository, DraftFileRow, DraftRow, DatasetRow } from '../repositories/depositing.repository';
import type { LabsRepository } from '../repositories/labs.repository';
import type { LabContext } from '../middleware/authorize';
import type { MultipartUploads } from '../storage/multipart-uploads';
import { PART_SIZE, partCount } from '../storage/multipart-uploads';
import type { ObjectStore } from '../storage/object-store';
import { sanitiseFileName } from '../storage/file-names';
import { isStorageUnreachable } from '../storage/storage-errors';
import type { JobQueue } from '../jobs/job-queue';
import type { Mailer } from '../mail/mailer';
import { mailTemplates } from '../mail/templates';
import type { QuotaService } from './quota.service';
import { BUNDLE_JOB } from './downloads.service';
import { validateMetadata } from '../../shared/metadata/validate-metadata';
import { formatDoi, newDatasetSuffix, releaseSuffix } from '../../shared/identifiers';
import { paths } from '../../shared/paths';
import type { CreateDatasetInput, DatasetListItem, DraftFileView, DraftView, IngestOptionsInput, StartUploadInput } from '../../shared/contracts';

export type Actor = { id: string; name: string; email: string };

type Deps = {
  repo: DepositingRepository;
  labs: LabsRepository;
  uploads: MultipartUploads;
  store: ObjectStore;
  quota: QuotaService;
  jobs: JobQueue;
  mailer: Pick<Mailer, 'send'>;
  log: Logger;
  doiPrefix: string;
  publicBaseUrl: string;
};

export const INGEST_JOB = 'ingest-file';
const EDITABLE: DraftRow['state'][] = ['editing', 'returned'];

const objectKeyFor = (labId: string, datasetId: string, fileId: string) => `labs/${labId}/datasets/${datasetId}/files/${fileId}/${randomUUID()}`;

type ResultDoc = {
  status?: 'ok' | 'invalid';
  validation?: { errors?: unknown[]; warnings?: unknown[] };
  summary?: (Record<string, unknown> & { durationS?: number | null }) | null;
  parameters?: { fps?: number | null; dims?: number | null };
};

/** Datasets, drafts, uploads and the review that ends in a release. */
export function createDepositingService(d: Deps) {
  const { repo } = d;

  async function draftInLab(lab: LabContext, draftId: string) {
    const found = await repo.findDraft(draftId);
    if (!found || found.dataset.labId !== lab.id) throw notFound('The draft');
    return found;
  }
  async function editableDraft(lab: LabContext, draftId: string) {
    const found = await draftInLab(lab, draftId);
    if (!EDITABLE.includes(found.draft.state)) {
      throw new AppError('draft_locked', found.draft.state === 'submitted' ? 'This draft is waiting for review; a curator must return it before it can change.' : 'This draft is closed.', 409);
    }
    return found;
  }
  async function fileInDraft(lab: LabContext, draftId: string, fileId: string) {
    const { draft, dataset } = await draftInLab(lab, draftId);
    const file = await repo.findFile(fileId);
    if (!file || file.draftId !== draft.id) throw notFound('The file');
    return { draft, dataset, file };
  }

  const doiOf = (suffix: string) => formatDoi(d.doiPrefix, suffix);

  async function fileView(f: DraftFileRow, draft: DraftRow): Promise<DraftFileView> {
    const result = f.result as ResultDoc | null;
    const job = ['queued', 'ingesting', 'verifying'].includes(f.state) || f.state === 'failed' ? ((await repo.latestJobFor(f.id)) ?? null) : null;
    return {
      id: f.id,
      fileName: f.fileName,
      role: f.role,
      mediaType: f.mediaType,
      declaredSize: f.declaredSize,
      sizeBytes: f.sizeBytes,
      sha256: f.sha256,
      state: f.state,
      errorMessage: f.errorMessage,
      job,
      status: result?.status ?? null,
      errors: result?.validation?.errors?.length ?? 0,
      warnings: result?.validation?.warnings?.length ?? 0,
      summary: result?.summary ?? null,
      measured: result?.status === 'ok' ? { fps: result.parameters?.fps ?? null, dims: result.parameters?.dims ?? null, durationS: result.summary?.durationS ?? null } : null,
      carriedOver: !!draft.baseReleaseId && f.uploadId === null && f.reservationId === null,
    };
  }

  function blockersOf(files: DraftFileView[], problems: unknown[]): string[] {
    const out: string[] = [];
    if (!files.some((f) => f.role === 'trajectories')) out.push('Add at least one trajectory file.');
    if (files.some((f) => ['uploading', 'verifying', 'queued', 'ingesting'].includes(f.state))) out.push('Wait until every file is uploaded and checked.');
    if (files.some((f) => f.state === 'invalid' || f.state === 'failed')) out.push('Remove or fix the files that did not pass the checks.');
    if (problems.length) out.push(`Complete the metadata (${problems.length} ${problems.length === 1 ? 'field needs' : 'fields need'} attention).`);
    return out;
  }

  async function notify(to: string[], build: (address: string) => ReturnType<(typeof mailTemplates)['draftSubmitted']>) {
    for (const address of to) {
      // Mail is best effort here; a failed send is logged and the action stands.
      await d.mailer.send(build(address)).catch((e) => d.log.warn({ err: e, to: address }, 'mail not sent'));
    }
  }

  return {
    async listDatasets(lab: LabContext): Promise<DatasetListItem[]> {
      return (await repo.datasetsOfLab(lab.id)).map((r) => ({
        id: r.id,
        title: r.title,
        summary: r.summary,
        suffix: r.suffix,
        doi: doiOf(r.suffix),
        openDraft: r.openDraft ? { id: r.openDraft.id, state: r.openDraft.state } : null,
        latestVersion: r.latestVersion,
        updatedAt: r.updatedAt.toISOString(),
      }));
    },

    /** The lab's download counts per month, for its dashboard. */
    async downloadsByMonth(lab: LabContext) {
      return repo.monthlyDownloads(lab.id);
    },

    /** Drafts waiting for a curator of the lab, oldest first. */
    async reviewQueue(lab: LabContext) {
      const rows = await repo.draftsInState(lab.id, 'submitted');
      return rows.map(({ draft, dataset }) => ({
        draftId: draft.id,
        datasetId: dataset.id,
        title: dataset.title,
        doi: doiOf(dataset.suffix),
        submittedAt: draft.submittedAt?.toISOString() ?? null,
        newVersion: !!draft.baseReleaseId,
      }));
    },

    async createDataset(actor: Actor, lab: LabContext, input: Required<CreateDatasetInput>) {
      const id = randomUUID();
      const draftId = randomUUID();
      for (let attempt = 0; ; attempt++) {
        const suffix = newDatasetSuffix();
        try {
          await repo.transaction(async (tx) => {
            await repo.insertDataset({ id, labId: lab.id, suffix, title: input.title, summary: input.summary, createdBy: actor.id }, tx);
            await repo.insertDraft(
              { id: draftId, datasetId: id, createdBy: actor.id, metadata: { schemaVersion: '1.0.0', title: input.title, description: input.summary, access: { level: 'open' } } },
              tx,
            );
          });
          return { datasetId: id, draftId, suffix, doi: doiOf(suffix) };
        } catch (e) {
          // 40 random bits: a clash is rare, but retry rather than fail.
          if (attempt < 3 && /dataset_suffix_unique/.test(String((e as Error).message ?? e))) continue;
          throw e;
        }
      }
    },

    async draft(lab: LabContext, draftId: string): Promise<DraftView> {
      const { draft, dataset } = await draftInLab(lab, draftId);
      const files = await Promise.all((await repo.files(draft.id)).map((f) => fileView(f, draft)));
      const problems = validateMetadata(draft.metadata);
      const comments = (await repo.comments(draft.id)).map((c) => ({ ...c, createdAt: c.createdAt.toISOString() }));
      const base = draft.baseReleaseId ? await repo.findRelease(draft.baseReleaseId) : undefined;
      const blockers = blockersOf(files, problems);
      return {
        id: draft.id,
        state: draft.state,
        dataset: { id: dataset.id, title: dataset.title, summary: dataset.summary, suffix: dataset.suffix, doi: doiOf(dataset.suffix) },
        metadata: draft.metadata,
        problems,
        files,
        comments,
        baseVersion: base?.version ?? null,
        changelog: draft.changelog,
        canSubmit: EDITABLE.includes(draft.state) && blockers.length === 0,
        blockers,
        uploadPartSize: PART_SIZE,
      };
    },

    /** Autosave: any object is kept (nothing typed is lost); the problems are returned for the form. */
    async saveMetadata(lab: LabContext, draftId: string, metadata: Record<string, unknown>, changelog?: string) {
      const { draft, dataset } = await editableDraft(lab, draftId);
      const title = typeof metadata.title === 'string' && metadata.title.trim().length >= 3 ? metadata.title.trim().slice(0, 300) : dataset.title;
      await repo.transaction(async (tx) => {
        await repo.updateDraft(draft.id, { metadata, ...(changelog !== undefined ? { changelog } : {}) }, tx);
        await repo.touchDataset(dataset.id, { title }, tx);
      });
      return { problems: validateMetadata(metadata), savedAt: new Date().toISOString() };
    },

    async startUpload(actor: Actor, lab: LabContext, draftId: string, input: Required<StartUploadInput>) {
      const { draft, dataset } = await editableDraft(lab, draftId);
      const fileName = sanitiseFileName(input.fileName);
      if ((await repo.files(draft.id)).some((f) => f.fileName === fileName)) {
        throw new AppError('file_exists', `This draft already has a file named ${fileName}. Remove it first or rename the new one.`, 409);
      }
      if (partCount(input.size) > 10_000) throw new AppError('file_too_large', 'This file is too large for one upload.', 413);
      // Refused here, before any byte is stored, when the lab's quota would be exceeded.
      const { reservationId } = await d.quota.reserve(lab.id, input.size, { labSlug: lab.slug });
      const fileId = randomUUID();
      const objectKey = objectKeyFor(lab.id, dataset.id, fileId);
      try {
        const uploadId = await d.uploads.start(objectKey, input.mediaType);
        await repo.insertFile({
          id: fileId,
          draftId: draft.id,
          fileName,
          objectKey,
          role: input.role,
          mediaType: input.mediaType,
          declaredSize: input.size,
          uploadId,
          reservationId,
          state: 'uploading',
        });
        const n = partCount(input.size);
        const first = Array.from({ length: Math.min(n, 200) }, (_, i) => i + 1);
        return { fileId, fileName, partSize: PART_SIZE, partCount: n, parts: await d.uploads.signParts(objectKey, uploadId, first) };
      } catch (e) {
        await d.quota.release(reservationId, lab.id);
        throw e;
      }
    },

    async signParts(lab: LabContext, draftId: string, fileId: string, partNumbers: number[]) {
      const { file } = await fileInDraft(lab, draftId, fileId);
      if (file.state !== 'uploading' || !file.uploadId) throw new AppError('upload_closed', 'This upload is finished or was cancelled.', 409);
      const n = partCount(file.declaredSize);
      if (partNumbers.some((p) => p > n)) throw new AppError('bad_part', `This file has ${n} parts.`, 400);
      return { parts: await d.uploads.signParts(file.objectKey, file.uploadId, partNumbers) };
    },

    async completeUpload(lab: LabContext, draftId: string, fileId: string, parts: Array<{ partNumber: number; etag: string }>) {
      const { file } = await fileInDraft(lab, draftId, fileId);
      if (file.state !== 'uploading' || !file.uploadId) throw new AppError('upload_closed', 'This upload is finished or was cancelled.', 409);
      const n = partCount(file.declaredSize);
      const numbers = new Set(parts.map((p) => p.partNumber));
      if (numbers.size !== n || [...numbers].some((p) => p < 1 || p > n)) {
        throw new AppError('parts_missing', `The upload needs all ${n} parts; ${numbers.size} arrived. Retry the missing ones.`, 400);
      }
      try {
        await d.uploads.complete(file.objectKey, file.uploadId, parts);
      } catch (e) {
        // A store that is down is not a refusal of the parts: the error middleware answers 503, and the upload can be completed later.
        if (isStorageUnreachable(e)) throw e;
        d.log.warn({ err: e, fileId }, 'multipart completion refused');
        throw new AppError('upload_incomplete', 'The storage did not accept the parts as one file. Retry the upload.', 409);
      }
      await repo.updateFile(file.id, { state: 'queued', uploadId: null });
      await d.jobs.enqueue(INGEST_JOB, { fileId: file.id });
      return { state: 'queued' };
    },

    async reingest(lab: LabContext, draftId: string, fileId: string, options: IngestOptionsInput) {
      await editableDraft(lab, draftId);
      const { file } = await fileInDraft(lab, draftId, fileId);
      if (file.role !== 'trajectories') throw new AppError('not_trajectories', 'Only trajectory files are checked by the engine.', 400);
      if (['uploading', 'queued', 'ingesting', 'verifying'].includes(file.state)) throw new AppError('busy', 'This file is still being uploaded or checked.', 409);
      await repo.updateFile(file.id, { ingestOptions: options, state: 'queued', errorMessage: null });
      await d.jobs.enqueue(INGEST_JOB, { fileId: file.id });
      return { state: 'queued' };
    },

    async removeFile(lab: LabContext, draftId: string, fileId: string) {
      await editableDraft(lab, draftId);
      const { file } = await fileInDraft(lab, draftId, fileId);
      if (file.uploadId) await d.uploads.abort(file.objectKey, file.uploadId).catch((e) => d.log.warn({ err: e }, 'abort failed'));
      if (file.reservationId && file.state === 'uploading') await d.quota.release(file.reservationId, lab.id);
      await repo.deleteFile(file.id);
      // The bytes go only when no draft or release points at them any more.
      if (!(await repo.objectReferenced(file.objectKey))) {
        await d.store.client.send(new DeleteObjectCommand({ Bucket: d.store.bucket, Key: file.objectKey })).catch(() => {});
        await d.quota.forget(lab.id, file.objectKey);
      }
    },

    async fileDetail(lab: LabContext, draftId: string, fileId: string) {
      const { draft, file } = await fileInDraft(lab, draftId, fileId);
      return { file: await fileView(file, draft), result: file.result, ingestOptions: file.ingestOptions };
    },

    /** The first lines of a file, for the column-mapping step. */
    async preview(lab: LabContext, draftId: string, fileId: string) {
      const { file } = await fileInDraft(lab, draftId, fileId);
      return { lines: await d.uploads.firstLines(file.objectKey, 12) };
    },

    async comment(actor: Actor, lab: LabContext, draftId: string, body: string) {
      const { draft } = await draftInLab(lab, draftId);
      await repo.addComment({ id: randomUUID(), draftId: draft.id, authorId: actor.id, kind: 'comment', body });
    },

    async submit(actor: Actor, lab: LabContext, draftId: string) {
      const view = await this.draft(lab, draftId);
      if (!EDITABLE.includes(view.state as DraftRow['state'])) throw new AppError('draft_locked', 'This draft is already submitted or closed.', 409);
      if (view.blockers.length) throw new AppError('not_ready', `The draft is not ready: ${view.blockers.join(' ')}`, 409);
      const moved = await repo.transitionDraft(draftId, EDITABLE, 'submitted', { submittedAt: new Date() });
      if (!moved) throw new AppError('draft_locked', 'This draft changed meanwhile; reload it.', 409);
      await repo.addComment({ id: randomUUID(), draftId, authorId: actor.id, kind: 'submitted', body: 'Submitted for review.' });
      const curators = (await d.labs.members(lab.id)).filter((m) => m.role === 'curator' || m.role === 'lead').map((m) => m.email);
      const url = `${d.publicBaseUrl}${paths.draft(lab.slug, draftId)}`;
      await notify(curators, (to) => mailTemplates.draftSubmitted(to, actor.name, view.dataset.title, lab.name, url));
      return { state: 'submitted' };
    },

    async returnDraft(actor: Actor, lab: LabContext, draftId: string, body: string) {
      const { draft, dataset } = await draftInLab(lab, draftId);
      const moved = await repo.transitionDraft(draft.id, ['submitted'], 'returned');
      if (!moved) throw new AppError('not_submitted', 'Only a submitted draft can be returned.', 409);
      await repo.addComment({ id: randomUUID(), draftId, authorId: actor.id, kind: 'returned', body });
      const depositor = (await d.labs.members(lab.id)).find((m) => m.userId === draft.createdBy);
      const url = `${d.publicBaseUrl}${paths.draft(lab.slug, draftId)}`;
      if (depositor) await notify([depositor.email], (to) => mailTemplates.draftReturned(to, actor.name, dataset.title, body, url));
      return { state: 'returned' };
    },

    async publish(actor: Actor, lab: LabContext, draftId: string, changelog: string) {
      const { draft, dataset } = await draftInLab(lab, draftId);
      if (draft.state !== 'submitted') throw new AppError('not_submitted', 'Only a submitted draft can be published.', 409);
      const problems = validateMetadata(draft.metadata);
      if (problems.length) throw new AppError('invalid_metadata', `The metadata is not complete: ${problems[0].message}`, 409);
      const files = await repo.files(draft.id);
      if (files.some((f) => !['ready', 'stored'].includes(f.state) || !f.sha256 || f.sizeBytes === null)) {
        throw new AppError('files_not_ready', 'Every file must be uploaded and checked before publishing.', 409);
      }
      const meta = draft.metadata as { title: string; licence: string; access: { level: 'open' | 'restricted' | 'embargoed'; embargoUntil?: string } };
      const releaseId = randomUUID();
      // One transaction: the version number, the release, its manifest and the draft's end.
      const version = await repo.transaction(async (tx) => {
        const moved = await repo.transitionDraft(draft.id, ['submitted'], 'published', {}, tx);
        if (!moved) throw new AppError('not_submitted', 'This draft was published or returned meanwhile.', 409);
        const v = await repo.nextVersion(dataset.id, tx);
        const suffix = releaseSuffix(dataset.suffix, v);
        await repo.insertRelease(
          {
            id: releaseId,
            datasetId: dataset.id,
            version: v,
            suffix,
            doi: doiOf(suffix),
            publishedBy: actor.id,
            title: meta.title,
            metadata: draft.metadata,
            statistics: Object.fromEntries(files.filter((f) => f.result).map((f) => [f.fileName, (f.result as ResultDoc).summary ?? null])),
            licence: meta.licence,
            accessLevel: meta.access.level,
            embargoUntil: meta.access.embargoUntil ? new Date(`${meta.access.embargoUntil}T00:00:00Z`) : null,
            changelog: changelog || draft.changelog,
          },
          files.map((f) => ({
            id: randomUUID(),
            releaseId,
            fileName: f.fileName,
            objectKey: f.objectKey,
            role: f.role,
            mediaType: f.mediaType,
            sizeBytes: f.sizeBytes!,
            sha256: f.sha256!,
            summary: (f.result as ResultDoc | null)?.summary ?? null,
            result: f.result,
          })),
          tx,
        );
        await repo.addComment({ id: randomUUID(), draftId, authorId: actor.id, kind: 'published', body: `Published as version ${v}.` }, tx);
        await repo.touchDataset(dataset.id, { title: meta.title }, tx);
        await repo.audit({ actorId: actor.id, action: 'release.published', subjectType: 'release', subjectId: releaseId, fromState: 'submitted', toState: 'published', detail: { suffix, doi: doiOf(suffix), version: v, files: files.length } }, tx);
        return v;
      });
      const suffix = releaseSuffix(dataset.suffix, version);
      await d.jobs.enqueue(REGISTER_JOB, { releaseId }, { maxAttempts: 8 });
      await d.jobs.enqueue(BUNDLE_JOB, { releaseId }, { maxAttempts: 5 });
      const depositor = (await d.labs.members(lab.id)).find((m) => m.userId === draft.createdBy);
      const url = `${d.publicBaseUrl}${paths.release(suffix)}`;
      if (depositor) await notify([depositor.email], (to) => mailTemplates.draftPublished(to, actor.name, meta.title, doiOf(suffix), url));
      return { releaseId, version, suffix, doi: doiOf(suffix) };
    },

    /** A new version: a draft from the latest release, its files carried over by reference. */
    async newVersion(actor: Actor, lab: LabContext, datasetId: string) {
      const dataset: DatasetRow | undefined = await repo.findDataset(datasetId);
      if (!dataset || dataset.labId !== lab.id) throw notFound('The dataset');
      if (await repo.openDraftOf(dataset.id)) throw new AppError('draft_exists', 'This dataset already has an open draft.', 409);
      const releases = await repo.releasesOf(dataset.id);
      const latest = releases.at(-1);
      if (!latest) throw new AppError('no_release', 'This dataset has no release yet; finish its first draft.', 409);
      const draftId = randomUUID();
      const oldFiles = await repo.releaseFiles(latest.id);
      const previous = await repo.latestResultsFor(oldFiles.map((f) => f.objectKey));
      await repo.transaction(async (tx) => {
        await repo.insertDraft({ id: draftId, datasetId: dataset.id, createdBy: actor.id, metadata: latest.metadata, baseReleaseId: latest.id }, tx);
        for (const f of oldFiles) {
          const before = previous.get(f.objectKey);
          await repo.insertFile(
            {
              id: randomUUID(),
              draftId,
              fileName: f.fileName,
              objectKey: f.objectKey,
              role: f.role,
              mediaType: f.mediaType,
              declaredSize: f.sizeBytes,
              sizeBytes: f.sizeBytes,
              sha256: f.sha256,
              state: f.role === 'trajectories' ? 'ready' : 'stored',
              ingestOptions: before?.ingestOptions ?? {},
              result: before?.result ?? f.result ?? null,
            },
            tx,
          );
        }
      });
      return { draftId };
    },
  };
}

export const REGISTER_JOB = 'register-identifier';
export type DepositingService = ReturnType<typeof createDepositingService>;
