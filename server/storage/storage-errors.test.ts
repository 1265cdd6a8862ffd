import { describe, expect, it } from 'vitest';
import { isStorageUnreachable } from './storage-errors';

describe('isStorageUnreachable(err)', () => {
  it('is true for the S3 client failing to connect or timing out', () => {
    expect(isStorageUnreachable({ code: 'ECONNREFUSED', $metadata: { attempts: 3 } })).toBe(true);
    expect(isStorageUnreachable({ name: 'TimeoutError', $metadata: {} })).toBe(true);
    expect(isStorageUnreachable({ message: 'wrapped', cause: { code: 'ECONNRESET', $metadata: {} } })).toBe(true);
  });

  it('is false for answers of a reachable store and for database socket errors', () => {
    expect(isStorageUnreachable({ name: 'NoSuchKey', $metadata: { httpStatusCode: 404 } })).toBe(false);
    // A PostgreSQL driver error has no $metadata: the database check answers it.
    expect(isStorageUnreachable({ code: 'ECONNREFUSED' })).toBe(false);
    expect(isStorageUnreachable(undefined)).toBe(false);
  });
});
