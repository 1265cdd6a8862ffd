import { createHash } from 'node:crypto';
import { Transform, type Readable } from 'node:stream';
import { GetObjectCommand } from '@aws-sdk/client-s3';
import type { Logger } from 'pino';
import type { DepositingRepository } from '../repositories/depositing.repository';
import type { ObjectStore } from '../storage/object-store';
import type { MultipartUploads } from '../storage/multipart-uploads';
import type { JobHandler, JobRow } from '../jobs/job-queue';
import type { IdentifierRegistrar } from '../identifiers/registration';
import type { QuotaService } from './quota.service';
import { analyzeStream } from '../ingest';
import type { IngestOptionsInput } from '../../shared/contracts';
import { formatDoi } from '../../shared/identifiers';
import { paths } from '../../shared/paths';

const withoutUndefined = <T extends object>(o: T): Partial<T> => Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined && v !== null)) as Partial<T>;

/** Ingest settings implied by the draft's metadata (schemas/dataset-metadata.schema.json). */
function fromMetadata(m: Record<string, unknown>): IngestOptionsInput {
  const axis = typeof m.gravityAxis === 'string' ? m.gravityAxis.replace('-', '') : undefined;
  return withoutUndefined({
    units: ['m', 'cm', 'mm', 'px'].includes(m.units as string) ? (m.units as IngestOptionsInput['units']) : undefined,
    pixelScale: typeof m.pixelSize === 'number' ? m.pixelSize : undefined,
    fps: typeof m.frameRate === 'number' && m.frameRate > 0 ? m.frameRate : undefined,
    dims: m.dimension === 2 || m.dimension === 3 ? m.dimension : undefined,
    gravityAxis: axis === 'x' || axis === 'y' || axis === 'z' ? axis : undefined,
  });
}

type Deps = {
  repo: DepositingRepository;
  store: ObjectStore;
  uploads: MultipartUploads;
  quota: QuotaService;
  log: Logger;
};

/** Passes bytes through while hashing and counting them; `complete` says whether the end was reached. */
function hashingTap(onBytes: (n: number) => void) {
  const hash = createHash('sha256');
  let size = 0;
  const tap = Object.assign(
    new Transform({
      transform(chunk: Buffer, _enc, cb) {
        hash.update(chunk);
        size += chunk.length;
        onBytes(size);
        cb(null, chunk);
      },
      flush(cb) {
        tap.complete = true;
        cb();
      },
    }),
    { complete: false, digest: () => ({ size, sha256: hash.digest('hex') }) },
  );
  return tap;
}

/**
 * The ingest job: streams the uploaded object once, computing its SHA-256 and
 * size while the engine reads it, then records the result in one update.
 * A job restarted after a crash simply starts again; nothing is half-written.
 */
export function createIngestJob({ repo, store, uploads, quota, log }: Deps): { handler: JobHandler; onFinalFailure: (row: JobRow, e: Error) => Promise<void> } {
  const handler: JobHandler = async (row, ctx) => {
    const fileId = String(row.payload.fileId);
    const file = await repo.findFile(fileId);
    if (!file) return; // removed meanwhile
    const found = await repo.findDraft(file.draftId);
    if (!found) return;
    await repo.updateFile(file.id, { state: file.role === 'trajectories' ? 'ingesting' : 'verifying', errorMessage: null });

    const object = await store.client.send(new GetObjectCommand({ Bucket: store.bucket, Key: file.objectKey }));
    const total = Number(object.ContentLength ?? file.declaredSize) || 1;
    let lastReport = 0;
    const tap = hashingTap((n) => {
      const now = Date.now();
      if (now - lastReport > 500) {
        lastReport = now;
        void ctx.progress(0.95 * (n / total), file.role === 'trajectories' ? 'reading and checking rows' : 'computing the checksum').catch(() => {});
      }
    });
    const body = (object.Body as Readable).pipe(tap);

    let result: Record<string, unknown> | null = null;
    if (file.role === 'trajectories') {
      // Units, frame rate, dimension and axes come from the metadata unless the mapping step chose otherwise.
      const o = { ...fromMetadata(found.draft.metadata), ...withoutUndefined(file.ingestOptions as IngestOptionsInput) };
      result = (await analyzeStream(body, {
        mapping: o.mapping,
        hasHeader: o.hasHeader ?? null,
        settings: { units: o.units, pixelScale: o.pixelScale ?? undefined, fps: o.fps ?? undefined, dims: o.dims ?? undefined, gravityAxis: o.gravityAxis ?? undefined },
        source: { name: file.fileName, bytes: total },
      })) as unknown as Record<string, unknown>;
    } else {
      for await (const _ of body) {
        // only hashing
      }
    }
    // The engine stops early on an invalid file; then the checksum needs its own read.
    const digest = tap.complete ? tap.digest() : await uploads.digest(file.objectKey);
    await ctx.progress(0.97, 'recording the result');
    if (file.reservationId) {
      await quota.confirm(file.reservationId, { objectKey: file.objectKey, sizeBytes: digest.size, sha256: digest.sha256, mediaType: file.mediaType });
    }
    const status = result ? (result.status as string) : 'stored';
    await repo.updateFile(file.id, {
      state: status === 'ok' ? 'ready' : status === 'invalid' ? 'invalid' : 'stored',
      result,
      sizeBytes: digest.size,
      sha256: digest.sha256,
      reservationId: null,
      errorMessage: status === 'invalid' ? 'The file did not pass the checks: see its report.' : null,
    });
    log.info({ fileId, status, bytes: digest.size }, 'file ingested');
  };

  const onFinalFailure = async (row: JobRow, e: Error) => {
    const fileId = String(row.payload.fileId);
    await repo.updateFile(fileId, { state: 'failed', errorMessage: `The file could not be processed: ${e.message}. It is kept; try "Check again".` });
  };
  return { handler, onFinalFailure };
}

/** Registers a release's identifier and its dataset's all-versions identifier, linked both ways. */
export function createRegisterJob({ repo, registrar, doiPrefix, publicBaseUrl }: { repo: DepositingRepository; registrar: IdentifierRegistrar; doiPrefix: string; publicBaseUrl: string }): JobHandler {
  return async (row) => {
    const rel = await repo.findRelease(String(row.payload.releaseId));
    if (!rel) return;
    const dataset = (await repo.findDataset(rel.datasetId))!;
    const all = await repo.releasesOf(dataset.id);
    const conceptDoi = formatDoi(doiPrefix, dataset.suffix);
    const meta = rel.metadata as { creators?: Array<{ name: string }>; description?: string };
    await registrar.register({
      doi: rel.doi,
      url: `${publicBaseUrl}${paths.release(rel.suffix)}`,
      metadata: {
        title: rel.title,
        creators: (meta.creators ?? []).map((c) => c.name),
        publicationYear: rel.publishedAt.getUTCFullYear(),
        version: String(rel.version),
        relatedIdentifiers: [{ identifier: conceptDoi, relationType: 'IsVersionOf' }],
      },
    });
    await registrar.register({
      doi: conceptDoi,
      url: `${publicBaseUrl}${paths.datasetLanding(dataset.suffix)}`,
      metadata: {
        title: rel.title,
        creators: (meta.creators ?? []).map((c) => c.name),
        relatedIdentifiers: all.map((r) => ({ identifier: r.doi, relationType: 'HasVersion' })),
      },
    });
  };
}
