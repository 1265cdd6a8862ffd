import Ajv from 'ajv';
import { createReadStream, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeStream } from './analyze-stream';

const dir = join(import.meta.dirname, '../../tests/fixtures/trajectories');
const manifest: { file: string; fps: number; model: string }[] = JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8'));
const validate = new Ajv({ strict: false }).compile(JSON.parse(readFileSync(join(import.meta.dirname, '../../schemas/ingest-result.schema.json'), 'utf8')));

describe('analyzeStream(readable, options) on the committed demo fixtures', () => {
  it.each(manifest)('$file is ingested and its result validates against the schema', async ({ file, fps }) => {
    // Source: ajv 8 against schemas/ingest-result.schema.json; fixtures from npm run demo:generate.
    const doc = await analyzeStream(createReadStream(join(dir, file)), { settings: { fps } });
    expect(doc.status).toBe('ok');
    expect(doc.input.compression).toBe('gzip');
    expect(validate(doc)).toBe(true);
  });
  it('the Vicsek 2D flock (η = 0.5) is polarized and the Langevin swarm is not', async () => {
    // Source: Vicsek et al., Phys. Rev. Lett. 75 (1995); midge swarms near 0 (Sci. Rep. 3, 2013).
    const v = await analyzeStream(createReadStream(join(dir, 'vicsek-flock-2d.csv.gz')), { settings: { fps: 25 } });
    const l = await analyzeStream(createReadStream(join(dir, 'trapped-langevin-swarm.csv.gz')), { settings: { fps: 100 } });
    expect(v.summary!.polarization.mean!).toBeGreaterThan(0.7);
    expect(l.summary!.polarization.mean!).toBeLessThan(0.5);
  });
});
