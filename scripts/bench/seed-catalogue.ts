import { randomUUID } from 'node:crypto';
import type { Db } from '../../server/db/client';
import { dataset, downloadEvent, organization, release, releaseFile, user } from '../../server/db/schema';
import { createSeededRandom } from '../../shared/engine/seeded-random';

// Invented labs; species are real scientific names, which are open vocabulary.
const LABS = ['Saltmarsh Motion Lab', 'Upland Flocking Group', 'Harbour Shoal Unit', 'Canopy Swarm Studio', 'Delta Herd Observatory', 'Basalt Colony Lab', 'Riverbend Tracking Group', 'Northfield Collective Motion'];
const SPECIES: Array<[string, string, string]> = [
  ['Culex pipiens', 'house mosquito', 'swarm'], ['Chironomus riparius', 'harlequin fly', 'swarm'], ['Anopheles gambiae', 'malaria mosquito', 'swarm'],
  ['Danio rerio', 'zebrafish', 'school'], ['Notemigonus crysoleucas', 'golden shiner', 'school'], ['Clupea harengus', 'herring', 'school'],
  ['Sturnus vulgaris', 'starling', 'flock'], ['Coloeus monedula', 'jackdaw', 'flock'], ['Columba livia', 'pigeon', 'flock'],
  ['Ovis aries', 'sheep', 'herd'], ['Apis mellifera', 'honey bee', 'colony'], ['Lasius niger', 'black garden ant', 'colony'],
];
const WORDS = ['dusk', 'dawn', 'marker', 'tank', 'arena', 'roost', 'predator', 'feeding', 'light', 'wind', 'turning', 'milling', 'polarised', 'cohesion', 'density', 'cameras', 'stereo', 'overhead', 'tunnel', 'meadow', 'reef', 'shore', 'winter', 'summer', 'acoustic', 'startle', 'foraging', 'migration'];
const LICENCES = ['CC-BY-4.0', 'CC0-1.0', 'CC-BY-SA-4.0', 'ODbL-1.0'];

/**
 * Seeds `n` synthetic releases (about one dataset in five has two versions)
 * into a migrated database, in chunks (one insert of many thousand rows
 * overflows PGlite's stack). The catalogue triggers index each release as it
 * is inserted, so `release_search` is filled as in production.
 */
export async function seedCatalogue(db: Db, n: number, opts: { seed?: number; chunk?: number } = {}) {
  const rnd = createSeededRandom(opts.seed ?? 7);
  const pick = <T>(a: readonly T[]) => a[Math.floor(rnd.uniform() * a.length)];
  const chunk = opts.chunk ?? 1000;
  const userId = `bench-user-${randomUUID()}`;
  await db.insert(user).values({ id: userId, name: 'Bench Depositor', email: `${userId}@bench.example`, emailVerified: true });
  const labs = LABS.map((name, i) => ({ id: `bench-lab-${i}-${randomUUID()}`, name, slug: `bench-${name.toLowerCase().replace(/\s+/g, '-')}-${i}`, createdAt: new Date() }));
  await db.insert(organization).values(labs);

  const start = Date.UTC(2023, 0, 1);
  const span = Date.UTC(2026, 10, 1) - start;
  type Row = typeof release.$inferInsert;
  let made = 0;
  let serial = 0;
  const releaseIds: string[] = [];
  while (made < n) {
    const datasets: Array<typeof dataset.$inferInsert> = [];
    const releases: Row[] = [];
    const files: Array<typeof releaseFile.$inferInsert> = [];
    while (releases.length < chunk && made + releases.length < n) {
      serial++;
      const lab = pick(labs);
      const [species, common, groupType] = pick(SPECIES);
      const words = Array.from({ length: 3 }, () => pick(WORDS));
      const suffix = `bench.${serial.toString(36)}`;
      const title = `${common[0].toUpperCase()}${common.slice(1)} ${groupType} ${words[0]} recording ${serial}`;
      const datasetId = randomUUID();
      datasets.push({ id: datasetId, labId: lab.id, suffix, title, createdBy: userId });
      const versions = rnd.uniform() < 0.2 && made + releases.length + 2 <= n ? 2 : 1;
      const individuals = Math.max(2, Math.round(Math.exp(1 + rnd.uniform() * 7)));
      const frameRate = pick([10, 25, 30, 50, 60, 100, 120, 200]);
      let publishedAt = start + rnd.uniform() * span;
      for (let v = 1; v <= versions; v++) {
        publishedAt += v > 1 ? rnd.uniform() * 3e9 : 0;
        const id = randomUUID();
        const metadata = {
          schemaVersion: '1.0.0',
          title,
          description: `Synthetic benchmark recording of ${individuals} ${common}s (${species}) ${words.join(', ')}; generated for the catalogue benchmark, not real data.`,
          creators: [{ name: `Researcher ${serial % 97}`, affiliation: { name: lab.name } }],
          keywords: [groupType, ...words],
          species: [{ name: species, commonName: common }],
          groupType,
          setting: rnd.uniform() < 0.5 ? 'laboratory' : 'field',
          dimension: rnd.uniform() < 0.6 ? 3 : 2,
          numberOfIndividuals: individuals,
          frameRate,
          licence: pick(LICENCES),
          access: { level: rnd.uniform() < 0.8 ? 'open' : 'restricted' },
        };
        const durationS = 10 + rnd.uniform() * 600;
        releases.push({
          id, datasetId, version: v, suffix: `${suffix}.v${v}`, doi: `10.99999/${suffix}.v${v}`, publishedAt: new Date(publishedAt), publishedBy: userId,
          title, metadata, licence: metadata.licence, accessLevel: metadata.access.level as 'open' | 'restricted',
          statistics: { 'tracks.csv': { tracks: individuals, durationS, polarization: { mean: rnd.uniform() }, springConstant: { throughOrigin: { springConstant: rnd.uniform() * 5 } } } },
        });
        files.push({
          id: randomUUID(), releaseId: id, fileName: 'tracks.csv', objectKey: `bench/${id}`, role: 'trajectories', mediaType: 'text/csv', sizeBytes: 1000, sha256: '0'.repeat(64),
          result: { series: { time: { meanSpeed: { t: Array.from({ length: 200 }, (_, i) => i), y: Array.from({ length: 200 }, (_, i) => 1 + Math.sin(i / 9) * 0.3 + rnd.uniform() * 0.1) } } } },
        });
        releaseIds.push(id);
      }
    }
    await db.insert(dataset).values(datasets);
    await db.insert(release).values(releases);
    await db.insert(releaseFile).values(files);
    made += releases.length;
  }
  // Downloads for the "most downloaded" order: a few hundred releases with some visitors each.
  const events: Array<typeof downloadEvent.$inferInsert> = [];
  for (let i = 0; i < Math.min(n, 500); i++) {
    const releaseId = pick(releaseIds);
    for (let k = 0; k < 1 + Math.floor(rnd.uniform() * 8); k++) events.push({ id: randomUUID(), releaseId, fileName: 'tracks.csv', visitorKey: `anon:${k}` });
  }
  for (let i = 0; i < events.length; i += chunk) await db.insert(downloadEvent).values(events.slice(i, i + chunk));
  return { releases: made, labs: labs.map((l) => l.slug), downloads: events.length };
}
