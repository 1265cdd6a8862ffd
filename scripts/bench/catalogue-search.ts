// Faceted catalogue search at the API: seeds synthetic releases into a fresh PGlite, starts the real app, and times
// varied queries over HTTP. Alone: `npm run bench -- --only search` (or `tsx scripts/bench/catalogue-search.ts --releases 10000`).
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseArgs } from 'node:util';
import pino from 'pino';
import { loadConfig } from '../../server/config';
import { startCohesia } from '../../server/runtime';
import { createSeededRandom } from '../../shared/engine/seeded-random';
import { FRAME_RATE_BUCKETS, INDIVIDUAL_BUCKETS } from '../../shared/catalogue/facets';
import { seedCatalogue } from './seed-catalogue';

const quantile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(p * sorted.length) - 1))];

/** Query strings mixing words, facets, sorts and second pages, reproducible from a seed. */
function queries(count: number, labs: string[]) {
  const rnd = createSeededRandom(11);
  const pick = <T>(a: readonly T[]) => a[Math.floor(rnd.uniform() * a.length)];
  const words = ['swarm', 'zebrafish school', 'starling', 'dusk marker', 'predator', 'milling tank', 'honey bee colony', 'winter roost', 'herring', 'stereo cameras', '"golden shiner"', 'mosquito -anopheles'];
  const out: string[] = [];
  for (let i = 0; i < count; i++) {
    const p = new URLSearchParams();
    if (rnd.uniform() < 0.7) p.set('q', pick(words));
    if (rnd.uniform() < 0.4) p.append('groupType', pick(['swarm', 'school', 'flock', 'herd', 'colony']));
    if (rnd.uniform() < 0.3) p.append('setting', pick(['laboratory', 'field']));
    if (rnd.uniform() < 0.3) p.append('individuals', pick(INDIVIDUAL_BUCKETS).id);
    if (rnd.uniform() < 0.2) p.append('frameRate', pick(FRAME_RATE_BUCKETS).id);
    if (rnd.uniform() < 0.2) p.append('lab', pick(labs));
    if (rnd.uniform() < 0.15) p.append('year', pick(['2023', '2024', '2025', '2026']));
    if (rnd.uniform() < 0.1) p.append('access', 'restricted');
    p.set('sort', pick(p.has('q') ? ['relevance', 'relevance', 'newest', 'group-size', 'downloads'] : ['newest', 'group-size', 'downloads']));
    out.push(p.toString());
  }
  return out;
}

export async function catalogueSearchBench(opts: { releases: number; queries: number }) {
  const dir = mkdtempSync(join(tmpdir(), 'cohesia-bench-search-'));
  const config = loadConfig({
    NODE_ENV: 'production', PORT: '0', DATA_DIR: dir, FAKES: 'on', DEMO_RELEASES: 'false', LOG_LEVEL: 'silent',
    BETTER_AUTH_SECRET: 'bench-secret-that-is-long-enough-0123456789', PUBLIC_BASE_URL: 'http://127.0.0.1:0',
  });
  const app = await startCohesia({ config, client: 'none', startFakes: true, workers: false, log: pino({ level: 'silent' }) });
  try {
    const t0 = performance.now();
    const seeded = await seedCatalogue(app.database.db, opts.releases);
    const seedSeconds = (performance.now() - t0) / 1000;
    process.stderr.write(`  seeded ${seeded.releases.toLocaleString('en-US')} releases in ${seedSeconds.toFixed(1)} s\n`);
    const list = queries(opts.queries, seeded.labs);
    const get = async (qs: string) => {
      const res = await fetch(`${app.url}/api/search?${qs}`);
      if (!res.ok) throw new Error(`search ${qs} answered ${res.status}: ${await res.text()}`);
      return (await res.json()) as { nextCursor: string | null; total: number };
    };
    for (const qs of list.slice(0, 10)) await get(qs); // warm-up: plans and caches
    const times: number[] = [];
    let totals = 0;
    for (const [i, qs] of list.entries()) {
      const start = performance.now();
      const first = await get(qs);
      times.push(performance.now() - start);
      totals += first.total;
      // Every fourth query also fetches its second page through the cursor.
      if (i % 4 === 0 && first.nextCursor) {
        const s2 = performance.now();
        await get(`${qs}&cursor=${encodeURIComponent(first.nextCursor)}`);
        times.push(performance.now() - s2);
      }
    }
    times.sort((a, b) => a - b);
    return { releases: seeded.releases, requests: times.length, seedSeconds, medianMs: quantile(times, 0.5), p95Ms: quantile(times, 0.95), maxMs: times.at(-1)!, meanHits: totals / list.length };
  } finally {
    await app.close();
    rmSync(dir, { recursive: true, force: true });
  }
}

export function printCatalogueSearch(r: Awaited<ReturnType<typeof catalogueSearchBench>>) {
  console.log(`\nCatalogue search at the API (${r.releases.toLocaleString('en-US')} releases, ${r.requests} requests, mean ${r.meanHits.toFixed(0)} hits per query)`);
  console.log(`  seeding ${r.seedSeconds.toFixed(1)} s · median ${r.medianMs.toFixed(1)} ms · p95 ${r.p95Ms.toFixed(1)} ms · max ${r.maxMs.toFixed(1)} ms`);
  console.log(`  median < 100 ms target ${r.medianMs < 100 ? 'MET' : 'NOT MET'}`);
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { values } = parseArgs({ options: { releases: { type: 'string', default: '10000' }, queries: { type: 'string', default: '200' } }, strict: false });
  catalogueSearchBench({ releases: Number(values.releases), queries: Number(values.queries) })
    .then((r) => {
      printCatalogueSearch(r);
      process.exit(0);
    })
    .catch((e) => {
      console.error(e);
      process.exit(1);
    });
}
