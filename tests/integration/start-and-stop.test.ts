import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import net from 'node:net';
import { spawn, type ChildProcess } from 'node:child_process';
import { describe, expect, it } from 'vitest';

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

function startMain(env: Record<string, string>): { child: ChildProcess; output: () => string; exited: Promise<number | null> } {
  let out = '';
  const child = spawn(process.execPath, ['--openssl-legacy-provider', '--import', 'tsx', 'server/main.ts'], {
    env: { ...process.env, ...env, LOG_LEVEL: 'warn', NODE_ENV: 'development' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (d) => (out += d));
  child.stderr!.on('data', (d) => (out += d));
  const exited = new Promise<number | null>((r) => child.on('exit', (code) => r(code)));
  return { child, output: () => out, exited };
}

async function waitFor(check: () => boolean, ms: number, what: string) {
  const until = Date.now() + ms;
  while (!check()) {
    if (Date.now() > until) throw new Error(`Timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

// The real `npm start` process (server/main.ts over the built client).
describe('server/main.ts', () => {
  it('starts with demo data, refuses a second start on the same data folder, and stops cleanly on SIGINT', async () => {
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'cohesia-main-'));
    const [port, s3, smtp, capture, registry] = [await freePort(), await freePort(), await freePort(), await freePort(), await freePort()];
    const env = {
      DATA_DIR: dataDir,
      PORT: String(port),
      S3_ENDPOINT: `http://127.0.0.1:${s3}`,
      SMTP_URL: `smtp://127.0.0.1:${smtp}`,
      MAIL_CAPTURE_URL: `http://127.0.0.1:${capture}`,
      DOI_REGISTRY_URL: `http://127.0.0.1:${registry}`,
    };
    const first = startMain(env);
    try {
      await waitFor(() => first.output().includes('Press Ctrl-C to stop.'), 45_000, 'the first start');
      expect(first.output()).toContain(`Cohesia is running at http://localhost:${port}`);
      expect(first.output()).toContain('/dev/mailbox');
      expect(first.output()).toMatch(/platform admin\s+nell\.ashby@harrowgate-rds\.example\s+password: demo-swarm-2026/);
      const page = await fetch(`http://127.0.0.1:${port}/labs/fenmoor-swarm-ecology`);
      expect(await page.text()).toContain('<div id="root">');
      const lab = await (await fetch(`http://127.0.0.1:${port}/api/labs/fenmoor-swarm-ecology`)).json();
      expect(lab.isDemo).toBe(true);

      const second = startMain({ ...env, PORT: String(await freePort()) });
      expect(await second.exited).toBe(1);
      expect(second.output()).toMatch(/already in use by another Cohesia process \(pid \d+\)/);

      first.child.kill('SIGINT');
      expect(await first.exited).toBe(0);
      expect(fs.existsSync(path.join(dataDir, 'cohesia.lock'))).toBe(false);
    } finally {
      first.child.kill('SIGKILL');
      fs.rmSync(dataDir, { recursive: true, force: true });
    }
  }, 90_000);

  it('stops before opening anything when a setting is invalid, naming the variable', async () => {
    const bad = startMain({ PORT: 'not-a-port', DATABASE_URL: 'mysql://nope' });
    expect(await bad.exited).toBe(1);
    expect(bad.output()).toContain('PORT');
    expect(bad.output()).toContain('DATABASE_URL');
  }, 30_000);
});
