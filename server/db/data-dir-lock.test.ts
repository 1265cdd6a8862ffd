import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { spawn } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { DataDirInUseError, lockDataDir } from './data-dir-lock';

const tmp = () => fs.mkdtempSync(path.join(os.tmpdir(), 'cohesia-lock-'));

describe('lockDataDir(dir)', () => {
  it('creates missing folders and releases the lock', () => {
    const dir = path.join(tmp(), 'a', 'b');
    const lock = lockDataDir(dir);
    expect(fs.readFileSync(path.join(dir, 'cohesia.lock'), 'utf8')).toBe(String(process.pid));
    lock.release();
    expect(fs.existsSync(path.join(dir, 'cohesia.lock'))).toBe(false);
  });

  it('refuses a folder held by another live process, naming it', async () => {
    const dir = tmp();
    const other = spawn(process.execPath, ['-e', 'setTimeout(() => {}, 10000)']);
    try {
      fs.writeFileSync(path.join(dir, 'cohesia.lock'), String(other.pid));
      expect(() => lockDataDir(dir)).toThrow(DataDirInUseError);
      expect(() => lockDataDir(dir)).toThrow(new RegExp(`already in use .*pid ${other.pid}`));
    } finally {
      other.kill();
    }
  });

  it('reclaims a lock whose process is gone', async () => {
    const dir = tmp();
    const dead = spawn(process.execPath, ['-e', '0']);
    await new Promise((r) => dead.on('exit', r));
    fs.writeFileSync(path.join(dir, 'cohesia.lock'), String(dead.pid));
    const lock = lockDataDir(dir);
    expect(fs.readFileSync(path.join(dir, 'cohesia.lock'), 'utf8')).toBe(String(process.pid));
    lock.release();
  });
});
