import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config';

/**
 * The built client (dist/, made by `npm test`'s build step) must carry no secret:
 * neither a configured value nor anything shaped like a key. Nothing is built here.
 */
const DIST = path.resolve('dist');

function files(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? files(path.join(dir, e.name)) : [path.join(dir, e.name)]));
}

// Values the server and the test apps use as secrets: the embedded defaults, and every
// secret-looking setting written in the test app's configuration.
function knownSecretValues(): string[] {
  const c = loadConfig({});
  const values = [c.authSecret, c.payments.secretKey, c.payments.webhookSecret, c.s3.secretAccessKey, c.identifiers.password];
  const testApp = fs.readFileSync('tests/support/test-app.ts', 'utf8');
  for (const m of testApp.matchAll(/(SECRET|PASSWORD|KEY)[A-Z_]*:\s*[`'"]([^`'"$]{6,})/g)) values.push(m[2]);
  return [...new Set(values)];
}

const SECRET_SHAPES: Array<[string, RegExp]> = [
  ['payment secret key', /\b[rs]k_(test|live)_[A-Za-z0-9]{4,}/],
  ['webhook signing secret', /\bwhsec_[A-Za-z0-9]{4,}/],
  ['private key', /-----BEGIN [A-Z ]*PRIVATE KEY-----/],
  ['AWS access key id', /\bAKIA[0-9A-Z]{16}\b/],
  ['credentials in a URL', /\b(smtps?|postgres(ql)?|https?):\/\/[^\s"'`/:@]+:[^\s"'`/@]+@/],
  ['API token of ours', /\bcoh_[A-Za-z0-9_-]{20,}/],
];

describe('the built client bundle', () => {
  const all = fs.existsSync(DIST) ? files(DIST) : [];
  const text = all.filter((f) => /\.(js|css|html|map|json|txt|svg)$/.test(f)).map((f) => ({ f: path.relative(DIST, f), body: fs.readFileSync(f, 'utf8') }));

  it('exists (build the client first: npx vite build)', () => {
    expect(text.some((t) => t.f === 'index.html')).toBe(true);
  });

  it('contains none of the configured secret values', () => {
    const secrets = knownSecretValues();
    expect(secrets.length).toBeGreaterThanOrEqual(5);
    const found = text.flatMap(({ f, body }) => secrets.filter((s) => body.includes(s)).map((s) => `${f}: ${s.slice(0, 6)}…`));
    expect(found).toEqual([]);
  });

  it('contains nothing shaped like a key, a signing secret or a password in a URL', () => {
    const found = text.flatMap(({ f, body }) => SECRET_SHAPES.filter(([, re]) => re.test(body)).map(([what]) => `${f}: ${what}`));
    expect(found).toEqual([]);
  });

  it('reads no process.env in its scripts: only Vite-inlined VITE_ variables reach the client', () => {
    const scripts = text.filter((t) => t.f.endsWith('.js'));
    expect(scripts.length).toBeGreaterThan(0);
    expect(scripts.filter((t) => /process\.env/.test(t.body)).map((t) => t.f)).toEqual([]);
    // import.meta.env is replaced at build time (VITE_ variables only); nothing of it may stay for the browser to fill.
    expect(scripts.filter((t) => /import\.meta\.env/.test(t.body)).map((t) => t.f)).toEqual([]);
  });
});
