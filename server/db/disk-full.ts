// SQLSTATE class 53 (insufficient resources: 53100 disk_full) and 58030 (io_error): the database
// refuses the write and keeps what it had, on PGlite as on a server; reads keep working.
const CANNOT_WRITE = new Set(['53000', '53100', '53200', '58030']);

/** Whether an error (or what it wraps: drizzle and better-auth wrap driver errors in `cause`) is the database unable to write. */
export function databaseCannotWrite(err: unknown): boolean {
  for (let e = err as { code?: unknown; cause?: unknown } | undefined, depth = 0; e && depth < 5; e = e.cause as typeof e, depth++) {
    if (typeof e.code === 'string' && CANNOT_WRITE.has(e.code)) return true;
  }
  return false;
}
