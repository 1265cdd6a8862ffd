import { HeadBucketCommand, S3Client } from '@aws-sdk/client-s3';
import type { Config } from '../config';

/** The S3 client for s3rver locally and any S3-compatible store in production. */
export function createObjectStore(s3: Config['s3']) {
  // The project is pinned to Node 20 on purpose; the SDK's notice about its future Node 22 floor is known.
  process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';
  const client = new S3Client({
    endpoint: s3.endpoint,
    region: s3.region,
    forcePathStyle: true,
    credentials: { accessKeyId: s3.accessKeyId, secretAccessKey: s3.secretAccessKey },
    // Without these the SDK frames streamed bodies with its own chunk
    // signatures, which s3rver stores verbatim (silent corruption).
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    maxAttempts: 3,
  });
  return {
    client,
    bucket: s3.bucket,
    async reachable(): Promise<boolean> {
      try {
        await client.send(new HeadBucketCommand({ Bucket: s3.bucket }));
        return true;
      } catch {
        return false;
      }
    },
    close: () => client.destroy(),
  };
}

export type ObjectStore = ReturnType<typeof createObjectStore>;
