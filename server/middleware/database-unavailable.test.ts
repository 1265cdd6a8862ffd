import { describe, expect, it } from 'vitest';
import { databaseUnavailable } from './error-handler';

// SQLSTATE classes from the PostgreSQL manual, appendix "PostgreSQL Error Codes".
describe('databaseUnavailable(err)', () => {
  it('is true for a server shutting down (57P01) and connection exceptions (class 08)', () => {
    expect(databaseUnavailable({ code: '57P01' })).toBe(true);
    expect(databaseUnavailable({ code: '08006' })).toBe(true);
    expect(databaseUnavailable({ code: 'ECONNREFUSED' })).toBe(true);
  });
  it('looks through wrappers (drizzle and better-auth put the driver error in cause)', () => {
    expect(databaseUnavailable({ message: 'Failed query: rollback', cause: { message: 'Client has encountered a connection error and is not queryable' } })).toBe(true);
    expect(databaseUnavailable({ message: 'Failed to get session', cause: { message: 'Failed query', cause: { code: '57P03' } } })).toBe(true);
  });
  it('is false for errors of the request itself (unique violation 23505, syntax 42601) and for nothing', () => {
    expect(databaseUnavailable({ code: '23505' })).toBe(false);
    expect(databaseUnavailable({ code: '42601', message: 'syntax error' })).toBe(false);
    expect(databaseUnavailable(undefined)).toBe(false);
    expect(databaseUnavailable(new Error('boom'))).toBe(false);
  });
});
