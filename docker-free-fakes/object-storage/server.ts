import fs from 'node:fs';
import S3rver from 's3rver';

export type ObjectStorageFake = { url: string; port: number; close(): Promise<void> };

// Browsers upload straight to the bucket, so the fake answers CORS preflights.
const corsXml = `<CORSConfiguration>
  <CORSRule>
    <AllowedOrigin>*</AllowedOrigin>
    <AllowedMethod>GET</AllowedMethod><AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>POST</AllowedMethod><AllowedMethod>HEAD</AllowedMethod><AllowedMethod>DELETE</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`;

/** S3-compatible storage on loopback (s3rver), objects kept under `directory`. */
export async function startObjectStorage(opts: { port: number; directory: string; bucket: string; host?: string }): Promise<ObjectStorageFake> {
  fs.mkdirSync(opts.directory, { recursive: true });
  const host = opts.host ?? '127.0.0.1';
  const server = new S3rver({
    address: host,
    port: opts.port,
    silent: true,
    directory: opts.directory,
    configureBuckets: [{ name: opts.bucket, configs: [corsXml] }],
  });
  const address = (await server.run()) as { port: number };
  return {
    url: `http://${host}:${address.port}`,
    port: address.port,
    close: () => server.close(),
  };
}
