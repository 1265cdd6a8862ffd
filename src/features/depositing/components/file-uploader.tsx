import { useEffect, useMemo, useReducer, useRef, useState } from 'react';
import Uppy, { type UppyFile } from '@uppy/core';
import AwsS3 from '@uppy/aws-s3';
import { useQueryClient } from '@tanstack/react-query';
import { Button } from '../../../components/button';
import { FormAlert } from '../../../components/form';
import { formatBytes } from '../../../lib/format';
import { completeUpload, removeFile, signParts, startUpload, type StartedUpload } from '../api/uploads';

type Meta = { role: 'trajectories' | 'supplementary' };
type Body = Record<string, never>;

/**
 * Drag-and-drop uploads straight to object storage. Uppy's S3 multipart
 * plugin does the part queue, progress, pause/resume and retries; our API
 * reserves the quota, signs each part's URL and completes the upload.
 */
export function FileUploader({ slug, draftId, partSize }: { slug: string; draftId: string; partSize: number }) {
  const qc = useQueryClient();
  const [, rerender] = useReducer((n: number) => n + 1, 0);
  const [dragging, setDragging] = useState(false);
  const [role, setRole] = useState<Meta['role']>('trajectories');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const input = useRef<HTMLInputElement>(null);
  // URLs signed when the upload started; more are asked for as needed.
  const signed = useRef(new Map<string, Map<number, string>>());
  // Our file id for each Uppy file, so a cancel reaches the server even mid-start.
  const serverIds = useRef(new Map<string, string>());

  const uppy = useMemo(() => {
    const u = new Uppy<Meta, Body>({ autoProceed: true, allowMultipleUploadBatches: true, restrictions: { minFileSize: 1 } });
    u.use(AwsS3<Meta, Body>, {
      shouldUseMultipart: true,
      limit: 4,
      retryDelays: [0, 1000, 3000, 5000],
      getChunkSize: () => partSize,
      async createMultipartUpload(file) {
        // Uppy starts over after a pause that came before the first part: reuse the upload it already has.
        const existing = serverIds.current.get(file.id);
        if (existing) return { uploadId: existing, key: existing };
        const started: StartedUpload = await startUpload(slug, draftId, {
          fileName: file.name ?? 'file',
          size: file.size ?? 0,
          mediaType: file.type || 'application/octet-stream',
          role: file.meta.role,
        });
        signed.current.set(started.fileId, new Map(started.parts.map((p) => [p.partNumber, p.url])));
        void qc.invalidateQueries({ queryKey: ['drafts', draftId] });
        if (!u.getFile(file.id)) {
          // Cancelled while the upload was being started: undo it on the server too.
          await removeFile(slug, draftId, started.fileId).catch(() => undefined);
          throw new Error('Upload cancelled');
        }
        serverIds.current.set(file.id, started.fileId);
        return { uploadId: started.fileId, key: started.fileId };
      },
      async signPart(_file, { uploadId, partNumber }) {
        const cache = signed.current.get(uploadId);
        const url = cache?.get(partNumber);
        if (url) {
          cache!.delete(partNumber); // a retry asks for a fresh one
          return { method: 'PUT', url };
        }
        const { parts } = await signParts(slug, draftId, uploadId, [partNumber]);
        return { method: 'PUT', url: parts[0].url };
      },
      async listParts() {
        return [];
      },
      async completeMultipartUpload(_file, { uploadId, parts }) {
        await completeUpload(slug, draftId, uploadId!, parts.map((p) => ({ partNumber: p.PartNumber!, etag: p.ETag! })));
        signed.current.delete(uploadId!);
        void qc.invalidateQueries({ queryKey: ['drafts', draftId] });
        return {};
      },
      async abortMultipartUpload(_file, { uploadId }) {
        signed.current.delete(uploadId!);
        await removeFile(slug, draftId, uploadId!).catch(() => undefined);
        void qc.invalidateQueries({ queryKey: ['drafts', draftId] });
      },
    });
    return u;
  }, [slug, draftId, partSize, qc]);

  useEffect(() => {
    const update = () => rerender();
    const onError = (file: UppyFile<Meta, Body> | undefined, error: { message: string }) => {
      if (file) setErrors((e) => ({ ...e, [file.id]: error.message }));
    };
    const onSuccess = (file: UppyFile<Meta, Body> | undefined) => {
      if (file) setTimeout(() => uppy.removeFile(file.id), 1500);
    };
    const onRemoved = (file: UppyFile<Meta, Body> | undefined) => {
      const id = file && serverIds.current.get(file.id);
      if (!file || !id) return;
      serverIds.current.delete(file.id);
      // A finished upload stays; an unfinished one is removed from the draft and its space released.
      if (!file.progress.uploadComplete) void removeFile(slug, draftId, id).catch(() => undefined).then(() => qc.invalidateQueries({ queryKey: ['drafts', draftId] }));
    };
    uppy.on('state-update', update);
    uppy.on('upload-error', onError);
    uppy.on('upload-success', onSuccess);
    uppy.on('file-removed', onRemoved);
    return () => {
      uppy.off('state-update', update);
      uppy.off('upload-error', onError);
      uppy.off('upload-success', onSuccess);
      uppy.off('file-removed', onRemoved);
    };
  }, [uppy, slug, draftId, qc]);
  useEffect(() => () => uppy.destroy(), [uppy]);

  const add = (files: FileList | File[]) => {
    for (const f of Array.from(files)) {
      try {
        uppy.addFile({ name: f.name, type: f.type || (f.name.endsWith('.gz') ? 'application/gzip' : 'text/csv'), data: f, meta: { role } });
      } catch (e) {
        setErrors((x) => ({ ...x, [f.name]: (e as Error).message }));
      }
    }
  };

  const files = uppy.getFiles();
  const total = files.reduce((s, f) => s + (f.size ?? 0), 0);
  const sent = files.reduce((s, f) => s + (f.progress.bytesUploaded || 0), 0);

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center gap-3 text-sm">
        <label className="flex items-center gap-2">
          Files are
          <select className="rounded border border-[#b7c3c9] bg-white px-2 py-1" value={role} onChange={(e) => setRole(e.target.value as Meta['role'])}>
            <option value="trajectories">trajectory tables (checked and analysed)</option>
            <option value="supplementary">supplementary (kept as they are)</option>
          </select>
        </label>
      </div>
      <div
        role="button"
        tabIndex={0}
        aria-label="Drop files here or choose them"
        data-testid="drop-zone"
        onKeyDown={(e) => (e.key === 'Enter' || e.key === ' ') && input.current?.click()}
        onClick={() => input.current?.click()}
        onDragOver={(e) => {
          e.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={(e) => {
          e.preventDefault();
          setDragging(false);
          add(e.dataTransfer.files);
        }}
        className={`flex cursor-pointer flex-col items-center justify-center gap-1 rounded-lg border-2 border-dashed px-4 py-8 text-center ${dragging ? 'border-dusk bg-[#e6eef3]' : 'border-[#b7c3c9] bg-white'}`}
      >
        <span className="font-medium">Drop trajectory files here, or choose them</span>
        <span className="text-xs text-ink/70">CSV or TSV, plain or gzip. Each file goes straight to storage in 8 MB parts; large files are fine.</span>
        <input ref={input} type="file" multiple className="sr-only" data-testid="file-input" onChange={(e) => e.target.files && add(e.target.files)} />
      </div>

      {files.length ? (
        <div className="flex flex-col gap-2 rounded-lg border border-mist bg-white p-3" aria-live="polite">
          <Progress label="All uploads" value={sent} max={total || 1} detail={`${formatBytes(sent)} of ${formatBytes(total)}`} />
          {files.map((f) => {
            const error = errors[f.id];
            const paused = !!f.isPaused;
            const done = !!f.progress.uploadComplete;
            return (
              <div key={f.id} className="flex flex-col gap-1 border-t border-mist pt-2" data-testid="upload-row">
                <div className="flex flex-wrap items-center gap-2 text-sm">
                  <span className="font-medium">{f.name}</span>
                  <span className="text-ink/60">{formatBytes(f.size)}</span>
                  <span className="ml-auto flex gap-1">
                    {!done && !error ? (
                      <Button variant="quiet" onClick={() => uppy.pauseResume(f.id)}>{paused ? 'Resume' : 'Pause'}</Button>
                    ) : null}
                    {error ? (
                      <Button
                        variant="quiet"
                        onClick={() => {
                          setErrors(({ [f.id]: _, ...rest }) => rest);
                          void uppy.retryUpload(f.id);
                        }}
                      >
                        Retry
                      </Button>
                    ) : null}
                    {!done ? <Button variant="quiet" onClick={() => uppy.removeFile(f.id)}>Cancel</Button> : null}
                  </span>
                </div>
                <Progress
                  label={`Upload of ${f.name}`}
                  value={f.progress.bytesUploaded || 0}
                  max={f.size || 1}
                  detail={done ? 'Uploaded — now being checked' : paused ? 'Paused' : `${f.progress.percentage ?? 0} %`}
                />
                {error ? <FormAlert>{error}</FormAlert> : null}
              </div>
            );
          })}
        </div>
      ) : null}
      {Object.entries(errors)
        .filter(([k]) => !files.some((f) => f.id === k))
        .map(([k, msg]) => (
          <FormAlert key={k}>{msg}</FormAlert>
        ))}
    </div>
  );
}

export function Progress({ label, value, max, detail }: { label: string; value: number; max: number; detail: string }) {
  const pct = Math.max(0, Math.min(100, (value / max) * 100));
  return (
    <div className="flex items-center gap-3">
      <div role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={Math.round(pct)} className="h-2 flex-1 overflow-hidden rounded-full bg-mist">
        <div className="h-full rounded-full bg-dusk transition-[width]" style={{ width: `${pct}%` }} />
      </div>
      <span className="w-48 text-right text-xs tabular-nums text-ink/70">{detail}</span>
    </div>
  );
}
