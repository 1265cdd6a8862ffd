import fs from 'node:fs';
import path from 'node:path';

export class DataDirInUseError extends Error {}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Exclusive lock on a data folder. PGlite has no guard against two processes
 * opening one directory (the writes of one are silently lost), so we take a
 * lock file holding our pid. It is written by hand rather than with a lock
 * package because a lock left by a killed process must be reclaimed at once,
 * which only a pid check can tell.
 */
export function lockDataDir(dir: string): { release(): void } {
  fs.mkdirSync(dir, { recursive: true });
  const file = path.join(dir, 'cohesia.lock');
  for (let attempt = 0; attempt < 2; attempt++) {
    try {
      const fd = fs.openSync(file, 'wx');
      fs.writeSync(fd, String(process.pid));
      fs.closeSync(fd);
      return {
        release() {
          try {
            if (fs.readFileSync(file, 'utf8') === String(process.pid)) fs.unlinkSync(file);
          } catch {
            // already gone
          }
        },
      };
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
      const pid = Number(fs.readFileSync(file, 'utf8'));
      if (pid && pid !== process.pid && alive(pid)) {
        throw new DataDirInUseError(
          `The data folder ${path.resolve(dir)} is already in use by another Cohesia process (pid ${pid}). ` +
            'Stop that process first, or set DATA_DIR to another folder.',
        );
      }
      fs.rmSync(file, { force: true }); // stale: its process is gone
    }
  }
  throw new DataDirInUseError(`Could not lock the data folder ${path.resolve(dir)}.`);
}
