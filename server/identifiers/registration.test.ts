import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startIdentifierRegistry, type IdentifierRegistryFake } from '../../docker-free-fakes/identifier-registry/server';
import { createHttpRegistrar } from './registration';

let registry: IdentifierRegistryFake;
const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'cohesia-registry-')), 'registry.json');

beforeAll(async () => {
  registry = await startIdentifierRegistry({ port: 0, file, user: 'cohesia', password: 'pw' });
});
afterAll(async () => registry?.close());

describe('createHttpRegistrar(opts) against the local registration agency', () => {
  it('registers, looks up case-insensitively and resolves to the landing page', async () => {
    const registrar = createHttpRegistrar({ baseUrl: registry.url, user: 'cohesia', password: 'pw' });
    await registrar.register({ doi: '10.99999/cx.4X7K-P9MQ5.v1', url: 'http://localhost:3000/doi/10.99999/cx.4X7K-P9MQ5.v1', metadata: { title: 'T' } });
    expect((await registrar.lookup('10.99999/cx.4x7k-p9mq5.v1'))?.url).toBe('http://localhost:3000/doi/10.99999/cx.4X7K-P9MQ5.v1');
    const res = await fetch(`${registry.url}/resolve/10.99999/CX.4X7K-P9MQ5.V1`, { redirect: 'manual' });
    expect(res.status).toBe(302);
    expect(res.headers.get('location')).toContain('/doi/10.99999/cx.4X7K-P9MQ5.v1');
    expect(JSON.parse(fs.readFileSync(file, 'utf8'))['10.99999/CX.4X7K-P9MQ5.V1'].state).toBe('findable');
  });

  it('fails clearly on wrong credentials and when the agency is down', async () => {
    const wrong = createHttpRegistrar({ baseUrl: registry.url, user: 'cohesia', password: 'nope' });
    await expect(wrong.register({ doi: '10.99999/x', url: 'http://a.example', metadata: {} })).rejects.toThrow(/refused .*401/);
    const down = createHttpRegistrar({ baseUrl: 'http://127.0.0.1:9', user: 'a', password: 'b' });
    await expect(down.register({ doi: '10.99999/x', url: 'http://a.example', metadata: {} })).rejects.toThrow(/cannot be reached/);
  });
});
