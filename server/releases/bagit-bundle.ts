import { createHash } from 'node:crypto';
import { PassThrough, Transform, type Readable } from 'node:stream';
import { once } from 'node:events';
import { GetObjectCommand } from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import { ZipArchive } from 'archiver';
import type { ObjectStore } from '../storage/object-store';

export type BundleFile = { path: string; objectKey: string; sizeBytes: number; compressed: boolean };
export type BundleText = { path: string; content: string };

export type BundleInput = {
  bagName: string;
  objectKey: string;
  payloadFiles: BundleFile[];
  metadataFiles: BundleText[];
  bagInfo: Record<string, string>;
};

/** Paths in manifests: relative to the bag, with CR, LF and % percent-encoded (RFC 8493 §2.1.3). */
const manifestPath = (p: string) => p.replace(/%/g, '%25').replace(/\r/g, '%0D').replace(/\n/g, '%0A');

function hashing() {
  const sha256 = createHash('sha256');
  const sha512 = createHash('sha512');
  let bytes = 0;
  const tap = new Transform({
    transform(chunk: Buffer, _e, cb) {
      sha256.update(chunk);
      sha512.update(chunk);
      bytes += chunk.length;
      cb(null, chunk);
    },
  });
  return { tap, result: () => ({ sha256: sha256.digest('hex'), sha512: sha512.digest('hex'), bytes }) };
}

const digest = (content: string, algo: 'sha256' | 'sha512') => createHash(algo).update(content, 'utf8').digest('hex');

/**
 * Builds a release bundle: a ZIP holding one bag in BagIt layout (RFC 8493),
 * streamed object by object from the store through archiver and back into the
 * store as a multipart upload, so no file is ever held whole in memory. The
 * payload manifests are written after the payload, from the hashes taken while
 * streaming it. Nothing under `objectKey` exists until the upload completes.
 */
export async function buildBagItBundle(store: ObjectStore, input: BundleInput): Promise<{ sizeBytes: number; payloadOxum: string }> {
  const archive = new ZipArchive({ zlib: { level: 6 }, forceZip64: false });
  const body = new PassThrough();
  archive.pipe(body);
  const upload = new Upload({
    client: store.client,
    params: { Bucket: store.bucket, Key: input.objectKey, Body: body, ContentType: 'application/zip' },
    queueSize: 2,
    partSize: 8 * 1024 * 1024,
    leavePartsOnError: false,
  });
  const uploaded = upload.done();
  const failed = new Promise<never>((_, reject) => archive.once('error', reject));
  const root = input.bagName;
  const lines256: string[] = [];
  const lines512: string[] = [];
  let octets = 0;

  const add = async (source: Readable | string, path: string, store: boolean) => {
    archive.append(source, { name: `${root}/${path}`, store });
    await Promise.race([once(archive, 'entry'), failed]);
  };

  for (const f of input.payloadFiles) {
    const obj = await store.client.send(new GetObjectCommand({ Bucket: store.bucket, Key: f.objectKey }));
    const h = hashing();
    // Already-compressed data is stored; text is deflated.
    await add((obj.Body as Readable).pipe(h.tap), f.path, f.compressed);
    const r = h.result();
    lines256.push(`${r.sha256}  ${manifestPath(f.path)}`);
    lines512.push(`${r.sha512}  ${manifestPath(f.path)}`);
    octets += r.bytes;
  }
  for (const m of input.metadataFiles) {
    await add(m.content, m.path, false);
    lines256.push(`${digest(m.content, 'sha256')}  ${manifestPath(m.path)}`);
    lines512.push(`${digest(m.content, 'sha512')}  ${manifestPath(m.path)}`);
    octets += Buffer.byteLength(m.content, 'utf8');
  }
  const payloadOxum = `${octets}.${input.payloadFiles.length + input.metadataFiles.length}`;
  const tags: BundleText[] = [
    { path: 'bagit.txt', content: 'BagIt-Version: 1.0\nTag-File-Character-Encoding: UTF-8\n' },
    {
      path: 'bag-info.txt',
      content: Object.entries({ ...input.bagInfo, 'Payload-Oxum': payloadOxum })
        .map(([k, v]) => `${k}: ${v.replace(/\r?\n/g, ' ')}`)
        .join('\n') + '\n',
    },
    { path: 'manifest-sha256.txt', content: lines256.join('\n') + '\n' },
    { path: 'manifest-sha512.txt', content: lines512.join('\n') + '\n' },
  ];
  for (const t of tags) await add(t.content, t.path, false);
  await add(tags.map((t) => `${digest(t.content, 'sha256')}  ${t.path}`).join('\n') + '\n', 'tagmanifest-sha256.txt', false);
  await Promise.race([archive.finalize(), failed]);
  await Promise.race([uploaded, failed]);
  return { sizeBytes: archive.pointer(), payloadOxum };
}
