import type { Db } from '../db/client';
import type { Auth } from '../auth/create-auth';
import { createUsersRepository } from '../repositories/users.repository';
import { createLabsRepository } from '../repositories/labs.repository';
import type { LabRole } from '../../shared/lab-roles';
import { demoPlans } from './demo-plans';

/**
 * Demo scenario (invented people, labs and places; see the README). Seeded on
 * the first start of an empty store. Every demo lab is flagged `isDemo` and
 * every account uses the reserved `.example` domain, so no real mail goes out.
 */
export const DEMO_PASSWORD = 'demo-swarm-2026';

type DemoUser = { key: string; name: string; email: string; admin?: boolean };
type DemoLab = {
  name: string;
  slug: string;
  institution: string;
  description: string;
  members: Array<{ user: string; role: LabRole }>;
};

const users: DemoUser[] = [
  { key: 'ops', name: 'Nell Ashby', email: 'nell.ashby@harrowgate-rds.example', admin: true },
  { key: 'marten', name: 'Dr Ilse Marten', email: 'ilse.marten@fenmoor.example' },
  { key: 'quist', name: 'Rafael Quist', email: 'rafael.quist@fenmoor.example' },
  { key: 'throssel', name: 'Mina Throssel', email: 'mina.throssel@fenmoor.example' },
  { key: 'okafor', name: 'Dr Tomas Okafor-Lind', email: 'tomas.okafor-lind@tidewater.example' },
  { key: 'penrose', name: 'Asha Penrose', email: 'asha.penrose@tidewater.example' },
  { key: 'haverly', name: 'Jun Haverly', email: 'jun.haverly@tidewater.example' },
  { key: 'vell', name: 'Dr Priya Vell', email: 'priya.vell@northgate-poly.example' },
  { key: 'lenning', name: 'Oskar Lenning', email: 'oskar.lenning@northgate-poly.example' },
  { key: 'whitcombe', name: 'Dana Whitcombe', email: 'dana.whitcombe@saltmarsh-uni.example' },
];

const labs: DemoLab[] = [
  {
    name: 'Fenmoor Swarm Ecology Group',
    slug: 'fenmoor-swarm-ecology',
    institution: 'University of Harrowgate (fictional), lakeside field station',
    description:
      'Dusk mosquito and mayfly swarms filmed over ground markers by three synchronised cameras at the Fenmoor lakeside station. Demo lab: all data synthetic.',
    members: [
      { user: 'marten', role: 'lead' },
      { user: 'quist', role: 'curator' },
      { user: 'throssel', role: 'depositor' },
    ],
  },
  {
    name: 'Tidewater Schooling Lab',
    slug: 'tidewater-schooling',
    institution: 'Coastal Institute of Marine Behaviour (fictional)',
    description:
      'Zebrafish and golden shiner schools in a circular tank, tracked in 2D from overhead. Demo lab: all data synthetic.',
    members: [
      { user: 'okafor', role: 'lead' },
      { user: 'penrose', role: 'curator' },
      { user: 'haverly', role: 'depositor' },
    ],
  },
  {
    name: 'Rookery Roof Array',
    slug: 'rookery-roof-array',
    institution: 'Northgate Polytechnic (fictional)',
    description:
      'Jackdaw and starling flocks recorded from a rooftop stereo camera rig. Demo lab: all data synthetic.',
    members: [
      { user: 'vell', role: 'lead' },
      { user: 'lenning', role: 'depositor' },
    ],
  },
];

export type DemoAccount = { role: string; name: string; email: string; password: string };

/** Seeds the demo scenario when the store has no accounts; returns the accounts (or the list again if already seeded). */
export async function seedDemo({ db, auth }: { db: Db; auth: Auth }): Promise<DemoAccount[]> {
  const usersRepo = createUsersRepository(db);
  const labsRepo = createLabsRepository(db);
  const accounts = describeAccounts();
  if ((await usersRepo.count()) > 0) return (await labsRepo.findBySlug(labs[0].slug)) ? accounts : [];

  const ctx = await auth.$context;
  const hash = await ctx.password.hash(DEMO_PASSWORD);
  const ids = new Map<string, string>();
  for (const u of users) {
    const created = await ctx.internalAdapter.createUser({ name: u.name, email: u.email, emailVerified: true }, { method: 'admin' });
    await ctx.internalAdapter.linkAccount({ userId: created.id, providerId: 'credential', accountId: created.id, password: hash });
    if (u.admin) await usersRepo.setPlatformRole(created.id, 'admin');
    ids.set(u.key, created.id);
  }
  for (const lab of labs) {
    const [first, ...rest] = lab.members;
    const org = await auth.api.createOrganization({
      body: { name: lab.name, slug: lab.slug, institution: lab.institution, description: lab.description, userId: ids.get(first.user)! },
    });
    await labsRepo.markDemo(org!.id);
    for (const m of rest) {
      await auth.api.addMember({ body: { userId: ids.get(m.user)!, role: m.role, organizationId: org!.id } });
    }
  }
  await demoPlans(db);
  return accounts;
}

function describeAccounts(): DemoAccount[] {
  const roleOf = (key: string) => {
    const u = users.find((x) => x.key === key)!;
    if (u.admin) return 'platform admin';
    for (const lab of labs) {
      const m = lab.members.find((x) => x.user === key);
      if (m) return `${m.role}, ${lab.name.split(' ')[0]}`;
    }
    return 'researcher (no lab)';
  };
  return users.map((u) => ({ role: roleOf(u.key), name: u.name, email: u.email, password: DEMO_PASSWORD }));
}
