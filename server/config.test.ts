import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from './config';

describe('loadConfig(env)', () => {
  it('runs the embedded mode with no variables at all', () => {
    const c = loadConfig({});
    expect(c.database).toEqual({ kind: 'pglite', dir: '.data/pglite' });
    expect(c.fakes).toBe(true);
    expect(c.publicBaseUrl).toBe('http://localhost:3000');
    expect(c.doiPrefix).toMatch(/^10\./);
  });

  it('switches to a PostgreSQL server and turns the fakes off by default', () => {
    const c = loadConfig({ DATABASE_URL: 'postgresql://u:p@db:5432/cohesia' });
    expect(c.database).toEqual({ kind: 'postgres', url: 'postgresql://u:p@db:5432/cohesia' });
    expect(c.fakes).toBe(false);
  });

  it('names each invalid variable', () => {
    const bad = () => loadConfig({ PORT: 'eighty', DATABASE_URL: 'mysql://x', DOI_PREFIX: '11.123', S3_ENDPOINT: 'not a url' });
    expect(bad).toThrow(ConfigError);
    try {
      bad();
    } catch (e) {
      const msg = (e as Error).message;
      for (const name of ['PORT', 'DATABASE_URL', 'DOI_PREFIX', 'S3_ENDPOINT']) expect(msg).toContain(name);
    }
  });

  it('refuses production without a secret and a public address', () => {
    expect(() => loadConfig({ NODE_ENV: 'production' })).toThrow(/BETTER_AUTH_SECRET[\s\S]*PUBLIC_BASE_URL/);
    expect(() => loadConfig({ NODE_ENV: 'production', BETTER_AUTH_SECRET: 'short', PUBLIC_BASE_URL: 'https://c.example' })).toThrow(/BETTER_AUTH_SECRET/);
    const ok = loadConfig({ NODE_ENV: 'production', BETTER_AUTH_SECRET: 's'.repeat(40), PUBLIC_BASE_URL: 'https://cohesia.example/' });
    expect(ok.publicBaseUrl).toBe('https://cohesia.example');
    expect(ok.fakes).toBe(false);
  });
});
