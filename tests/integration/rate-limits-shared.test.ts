import fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { openPglite, openPostgres } from '../../server/db/client';
import { createRateLimitRepository } from '../../server/repositories/rate-limits.repository';
import { startTestApp, type TestApp } from '../support/test-app';
import { httpClient } from '../support/http-client';
import { createTestDatabase } from '../support/postgres';

const pgAdminUrl = inject('pgAdminUrl');
const pgTemplate = inject('pgTemplate');
const LEAD = 'ilse.marten@fenmoor.example';

describe('rate-limit counters in the database (fixed windows)', () => {
  it('counts hits in a window, starts a new window once it has ended, takes a hit back, resets and sweeps', async () => {
    // The database of this pass: the embedded one, or a copy of the template on the PostgreSQL server.
    const database = pgAdminUrl
      ? await openPostgres(await createTestDatabase(pgAdminUrl, pgTemplate!, `${pgTemplate}_limit_rows`))
      : await openPglite({ template: await fs.openAsBlob(inject('templatePath')) });
    try {
      const repo = createRateLimitRepository(database.db);
      const first = await repo.hit('sign-in:198.51.100.4', 60_000);
      expect(first.hits).toBe(1);
      expect(first.resetAt.getTime()).toBeGreaterThan(Date.now() + 50_000);
      expect((await repo.hit('sign-in:198.51.100.4', 60_000)).hits).toBe(2);
      const third = await repo.hit('sign-in:198.51.100.4', 60_000);
      expect(third.hits).toBe(3);
      expect(third.resetAt.getTime()).toBe(first.resetAt.getTime()); // the same window
      await repo.unhit('sign-in:198.51.100.4');
      expect((await repo.hit('sign-in:198.51.100.4', 60_000)).hits).toBe(3);
      expect((await repo.hit('sign-up:198.51.100.4', 60_000)).hits).toBe(1); // another limiter, its own count
      // A window of 50 ms: once it has ended the next hit is the first of a new one.
      await repo.hit('short:198.51.100.4', 50);
      await repo.hit('short:198.51.100.4', 50);
      await new Promise((r) => setTimeout(r, 80));
      expect((await repo.hit('short:198.51.100.4', 50)).hits).toBe(1);
      await repo.reset('sign-in:198.51.100.4');
      expect((await repo.hit('sign-in:198.51.100.4', 60_000)).hits).toBe(1);
      await new Promise((r) => setTimeout(r, 80));
      await repo.sweep(new Date());
      expect((await repo.hit('short:198.51.100.4', 50)).hits).toBe(1);
      expect((await repo.hit('sign-in:198.51.100.4', 60_000)).hits).toBe(2); // not yet ended: kept
    } finally {
      await database.close();
    }
  });
});

// Two instances behind one load balancer: an address gets the limit once, not once per instance.
// Only when the suite runs against a PostgreSQL server (CI's second pass).
describe.skipIf(!pgAdminUrl)('rate limits shared by two instances on a PostgreSQL server', () => {
  let a: TestApp;
  let b: TestApp;
  beforeAll(async () => {
    const databaseUrl = await createTestDatabase(pgAdminUrl!, pgTemplate!, `${pgTemplate}_limits`);
    const env = { DATABASE_URL: databaseUrl, RATE_LIMIT_SIGN_IN: '4', RATE_LIMIT_WINDOW_SECONDS: '600' };
    a = await startTestApp({ workers: false, env });
    b = await startTestApp({ workers: false, env: { ...env, PUBLIC_BASE_URL: a.url } });
  }, 120_000);
  afterAll(async () => {
    await b?.close();
    await a?.close();
  });

  it('refuses the fifth sign-in attempt from one address whichever instance gets it', async () => {
    const [ha, hb] = [httpClient(a.url), httpClient(b.url)];
    for (const h of [ha, hb, ha, hb]) expect((await h.post('/api/auth/sign-in/email', { email: LEAD, password: 'wrong-password-guess' })).status).toBe(401);
    for (const h of [ha, hb]) {
      const res = await h.post('/api/auth/sign-in/email', { email: LEAD, password: 'demo-swarm-2026' });
      expect(res.status).toBe(429);
      expect(res.json.code).toBe('rate_limited');
      expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(500);
    }
  });
});
