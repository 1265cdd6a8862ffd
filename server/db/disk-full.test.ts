import { describe, expect, it } from 'vitest';
import { databaseCannotWrite } from './disk-full';

describe('databaseCannotWrite(err)', () => {
  it('is true for disk full and I/O errors, also when wrapped', () => {
    expect(databaseCannotWrite({ code: '53100' })).toBe(true);
    expect(databaseCannotWrite({ message: 'Failed query', cause: { code: '58030' } })).toBe(true);
  });
  it('is false for other database errors', () => {
    expect(databaseCannotWrite({ code: '23505' })).toBe(false);
    expect(databaseCannotWrite(undefined)).toBe(false);
  });
});
