import { gzipSync } from 'node:zlib';
import type { Logger } from 'pino';
import { eq } from 'drizzle-orm';
import type { Config } from '../config';
import type { Database } from '../db/client';
import { user } from '../db/schema';
import type { ObjectStore } from '../storage/object-store';
import { createJobQueue } from '../jobs/job-queue';
import { createDepositingModule } from '../depositing-module';
import { createLabsRepository } from '../repositories/labs.repository';
import { createDepositingRepository } from '../repositories/depositing.repository';
import {
  generateAdaptiveGravitySwarm,
  generateLangevinSwarm,
  generateVicsekFlock,
  rowsToCsv,
  type SyntheticRow,
} from '../../shared/engine/synthetic-trajectories';

type Recording = { fileName: string; dims: 2 | 3; velocities: boolean; generate: (emit: (r: SyntheticRow) => void) => void };
type DemoDataset = {
  lab: string;
  depositor: string;
  curator: string;
  title: string;
  summary: string;
  metadata: Record<string, unknown>;
  versions: Array<{ recordings: Recording[]; changelog: string; metadata?: Record<string, unknown> }>;
};

const creators = (...people: Array<[string, string]>) => people.map(([name, affiliation]) => ({ name, affiliation: { name: affiliation } }));

/**
 * The demo releases: synthetic trajectories from the models in SCIENCE.md,
 * deposited through the same service calls a depositor's browser makes
 * (presigned upload, ingest job, submit, publish). Invented labs and people;
 * every description says the data are synthetic.
 */
const datasets: DemoDataset[] = [
  {
    lab: 'fenmoor-swarm-ecology',
    depositor: 'mina.throssel@fenmoor.example',
    curator: 'rafael.quist@fenmoor.example',
    title: 'Dusk mating swarms of Culex pipiens over ground marker A',
    summary: 'Male mosquito swarms filmed at dusk by three synchronised cameras. Synthetic demo data.',
    metadata: {
      description:
        'Male Culex pipiens swarming over a black ground marker at dusk, reconstructed in 3D from three synchronised cameras at 100 frames/s. SYNTHETIC DEMO DATA generated from a trapped Langevin model; not a real recording.',
      creators: creators(['Mina Throssel', 'University of Harrowgate'], ['Ilse Marten', 'University of Harrowgate']),
      contact: { name: 'Ilse Marten', email: 'ilse.marten@fenmoor.example' },
      keywords: ['swarm', 'mosquito', 'mating swarm', 'demo'],
      species: [{ name: 'Culex pipiens', commonName: 'common house mosquito' }],
      groupType: 'swarm',
      setting: 'field',
      site: { place: 'Fenmoor lakeside station, marker A (fictional)' },
      recordingDates: { start: '2026-06-14', end: '2026-06-19' },
      dimension: 3,
      units: 'm',
      frameRate: 100,
      gravityAxis: 'z',
      cameras: { count: 3, model: 'Synchronised machine-vision cameras (demo)' },
      tracking: { method: 'Stereo matching and track linking (demo description)' },
      licence: 'CC-BY-4.0',
      access: { level: 'open' },
    },
    versions: [
      {
        changelog: 'First release.',
        recordings: [{ fileName: 'marker-a-2026-06-14.csv.gz', dims: 3, velocities: false, generate: (e) => generateLangevinSwarm({ seed: 101, individuals: 14, fps: 100, seconds: 20, springConstant: 4, relaxationTime: 0.3, speedSd: 0.1 }, e) }],
      },
      {
        changelog: 'Adds the recording of 19 June 2026.',
        recordings: [{ fileName: 'marker-a-2026-06-19.csv.gz', dims: 3, velocities: false, generate: (e) => generateLangevinSwarm({ seed: 102, individuals: 22, fps: 100, seconds: 20, springConstant: 3, relaxationTime: 0.3, speedSd: 0.1 }, e) }],
      },
    ],
  },
  {
    lab: 'fenmoor-swarm-ecology',
    depositor: 'mina.throssel@fenmoor.example',
    curator: 'rafael.quist@fenmoor.example',
    title: 'Anopheles gambiae swarm held together by long-range attraction',
    summary: 'A malaria-mosquito swarm over the east marker. Synthetic demo data, shared on request.',
    metadata: {
      description:
        'Swarm of Anopheles gambiae over the east marker, 3D at 100 frames/s. SYNTHETIC DEMO DATA from an adaptive long-range attraction model; not a real recording. Files are shared on request.',
      creators: creators(['Rafael Quist', 'University of Harrowgate']),
      contact: { name: 'Rafael Quist', email: 'rafael.quist@fenmoor.example' },
      keywords: ['swarm', 'acoustic attraction', 'demo'],
      species: [{ name: 'Anopheles gambiae' }],
      groupType: 'swarm',
      setting: 'laboratory',
      dimension: 3,
      units: 'm',
      frameRate: 100,
      gravityAxis: 'z',
      licence: 'CC-BY-NC-4.0',
      access: { level: 'restricted' },
    },
    versions: [
      {
        changelog: 'First release.',
        recordings: [{ fileName: 'east-marker-swarm.csv.gz', dims: 3, velocities: false, generate: (e) => generateAdaptiveGravitySwarm({ seed: 202, individuals: 16, fps: 100, seconds: 15, strength: 0.05, adaptiveRadius: 0.1, relaxationTime: 0.5, speedSd: 0.15 }, e) }],
      },
    ],
  },
  {
    lab: 'tidewater-schooling',
    depositor: 'jun.haverly@tidewater.example',
    curator: 'asha.penrose@tidewater.example',
    title: 'Zebrafish school in the 1 m circular tank, overhead view',
    summary: 'A school of 60 zebrafish tracked in 2D from above. Synthetic demo data.',
    metadata: {
      description: 'Zebrafish schooling in a circular tank, tracked in 2D from an overhead camera at 25 frames/s. SYNTHETIC DEMO DATA from a Vicsek model; not a real recording.',
      creators: creators(['Jun Haverly', 'Coastal Institute of Marine Behaviour'], ['Tomas Okafor-Lind', 'Coastal Institute of Marine Behaviour']),
      contact: { name: 'Tomas Okafor-Lind', email: 'tomas.okafor-lind@tidewater.example' },
      keywords: ['school', 'fish', 'demo'],
      species: [{ name: 'Danio rerio', commonName: 'zebrafish' }],
      groupType: 'school',
      setting: 'laboratory',
      dimension: 2,
      units: 'm',
      frameRate: 25,
      gravityAxis: 'none',
      cameras: { count: 1 },
      licence: 'CC0-1.0',
      access: { level: 'open' },
    },
    versions: [
      {
        changelog: 'First release.',
        recordings: [{ fileName: 'tank-school.csv.gz', dims: 2, velocities: true, generate: (e) => generateVicsekFlock({ seed: 303, individuals: 60, fps: 25, seconds: 40, dims: 2, box: 5, radius: 1, speed: 0.3, noise: 0.5 }, e) }],
      },
    ],
  },
  {
    lab: 'rookery-roof-array',
    depositor: 'oskar.lenning@northgate-poly.example',
    curator: 'priya.vell@northgate-poly.example',
    title: 'Starling flock over the Northgate roof at the winter roost',
    summary: 'A starling flock from the rooftop stereo rig. Synthetic demo data under embargo.',
    metadata: {
      description: 'Starlings arriving at a winter roost, reconstructed in 3D by a rooftop stereo rig at 25 frames/s. SYNTHETIC DEMO DATA from a Vicsek model; not a real recording.',
      creators: creators(['Oskar Lenning', 'Northgate Polytechnic'], ['Priya Vell', 'Northgate Polytechnic']),
      contact: { name: 'Priya Vell', email: 'priya.vell@northgate-poly.example' },
      keywords: ['flock', 'birds', 'roost', 'demo'],
      species: [{ name: 'Sturnus vulgaris', commonName: 'common starling' }],
      groupType: 'flock',
      setting: 'field',
      site: { place: 'Northgate Polytechnic roof (fictional)' },
      dimension: 3,
      units: 'm',
      frameRate: 25,
      gravityAxis: 'z',
      cameras: { count: 2 },
      licence: 'CC-BY-4.0',
      access: { level: 'embargoed', embargoUntil: '2027-06-01' },
    },
    versions: [
      {
        changelog: 'First release.',
        recordings: [{ fileName: 'roost-arrival.csv.gz', dims: 3, velocities: true, generate: (e) => generateVicsekFlock({ seed: 404, individuals: 80, fps: 25, seconds: 20, dims: 3, box: 20, radius: 3, speed: 10, noise: 0.3 }, e) }],
      },
    ],
  },
];

/** Publishes the demo releases once, on a store that has none. */
export async function seedDemoReleases({ config, database, store, log }: { config: Config; database: Database; store: ObjectStore; log: Logger }) {
  const repo = createDepositingRepository(database.db);
  const labsRepo = createLabsRepository(database.db);
  const first = await labsRepo.findBySlug(datasets[0].lab);
  if (!first || (await repo.datasetsOfLab(first.id)).length) return;
  const quiet = log.child({ area: 'demo-seed' });
  // Seeding sends no mail: the demo people would only get notices of the seed itself.
  const jobs = createJobQueue({ db: database.db, log: quiet });
  const mod = createDepositingModule({ config, database, store, log: quiet, mailer: { send: async () => {} }, jobs });
  const actor = async (email: string) => {
    const [u] = await database.db.select({ id: user.id, name: user.name, email: user.email }).from(user).where(eq(user.email, email));
    return u;
  };

  for (const d of datasets) {
    const lab = (await labsRepo.findBySlug(d.lab))!;
    const depositor = await actor(d.depositor);
    const curator = await actor(d.curator);
    const ctx = (role: 'depositor' | 'curator') => ({ id: lab.id, slug: lab.slug, name: lab.name, role });
    const created = await mod.service.createDataset(depositor, ctx('depositor'), { title: d.title, summary: d.summary });
    let draftId = created.draftId;
    for (const [i, v] of d.versions.entries()) {
      if (i > 0) draftId = (await mod.service.newVersion(depositor, ctx('depositor'), created.datasetId)).draftId;
      await mod.service.saveMetadata(ctx('depositor'), draftId, { schemaVersion: '1.0.0', title: d.title, ...d.metadata, ...v.metadata }, v.changelog);
      for (const rec of v.recordings) {
        const rows: SyntheticRow[] = [];
        rec.generate((r) => rows.push(r));
        const bytes = gzipSync(rowsToCsv(rows, { dims: rec.dims, velocities: rec.velocities, digits: 5 }));
        const up = await mod.service.startUpload(depositor, ctx('depositor'), draftId, { fileName: rec.fileName, size: bytes.length, mediaType: 'application/gzip', role: 'trajectories' });
        const parts = [];
        for (const p of up.parts) {
          const res = await fetch(p.url, { method: 'PUT', body: new Uint8Array(bytes.subarray((p.partNumber - 1) * up.partSize, p.partNumber * up.partSize)) });
          if (!res.ok) throw new Error(`demo upload failed: ${res.status}`);
          parts.push({ partNumber: p.partNumber, etag: res.headers.get('etag')! });
        }
        await mod.service.completeUpload(ctx('depositor'), draftId, up.fileId, parts);
      }
      await jobs.drain(mod.handlers, mod.onFinalFailure);
      const individuals = Math.max(...(await repo.files(draftId)).map((f) => ((f.result as { summary?: { tracks?: number } } | null)?.summary?.tracks ?? 0)));
      const draft = (await repo.findDraft(draftId))!;
      await mod.service.saveMetadata(ctx('depositor'), draftId, { ...draft.draft.metadata, numberOfIndividuals: individuals }, v.changelog);
      await mod.service.submit(depositor, ctx('depositor'), draftId);
      await mod.service.publish(curator, ctx('curator'), draftId, v.changelog);
    }
  }
  // Register the identifiers with the (local) registration agency.
  await jobs.drain(mod.handlers, mod.onFinalFailure);
  quiet.info('demo releases published');
}
