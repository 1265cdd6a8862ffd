import { AppError } from '../errors';

// Network failures of the S3 client (Node's socket codes and the SDK's timeout names) mean the store is down, not that the request was wrong.
const NETWORK_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'ENOTFOUND', 'EAI_AGAIN', 'EPIPE', 'ECONNABORTED']);
const NETWORK_NAMES = new Set(['TimeoutError', 'RequestTimeout', 'ServiceUnavailable', 'SlowDown']);

/** Whether an error came from not reaching the object store (after the SDK's own retries). */
export function isStorageUnreachable(err: unknown): boolean {
  for (let e = err as { code?: string; name?: string; cause?: unknown; $metadata?: unknown } | undefined, depth = 0; e && depth < 4; e = e.cause as typeof e, depth++) {
    // Only the SDK's errors carry $metadata, which keeps a database socket error out of this.
    if (!e.$metadata) continue;
    if ((e.code && NETWORK_CODES.has(e.code)) || (e.name && NETWORK_NAMES.has(e.name))) return true;
  }
  return false;
}

export const storageUnreachable = () => new AppError('storage_unreachable', 'The file storage is unreachable at the moment; nothing was changed. Please try again in a minute.', 503);
