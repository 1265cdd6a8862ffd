import { randomUUID } from 'node:crypto';
import type { Logger } from 'pino';
import { AppError, notFound } from '../errors';
import type { AccessRepository } from '../repositories/access.repository';
import type { DepositingRepository } from '../repositories/depositing.repository';
import type { LabsRepository } from '../repositories/labs.repository';
import type { LabContext } from '../middleware/authorize';
import type { Mailer } from '../mail/mailer';
import { mailTemplates } from '../mail/templates';
import { paths } from '../../shared/paths';
import type { AccessRequestView } from '../../shared/contracts';

export const DEFAULT_TERMS = [
  'By requesting access to these files you agree to:',
  '1. use them only for the purpose you state in your request;',
  '2. not pass the files on to anyone else; colleagues make their own request;',
  '3. cite the release (its identifier is on the release page) in any work that uses it;',
  '4. tell the lab if you find an error in the data;',
  '5. follow the rules of your own institution on research data.',
].join('\n');

type Actor = { id: string; name: string; email: string };
type Deps = { access: AccessRepository; repo: DepositingRepository; labs: LabsRepository; mailer: Pick<Mailer, 'send'>; publicBaseUrl: string; log: Logger; now?: () => Date };

/** Requests for the files of restricted releases, the lab's decisions, and the grants they give. */
export function createAccessService(d: Deps) {
  const now = d.now ?? (() => new Date());
  const link = (p: string) => `${d.publicBaseUrl}${p}`;
  const mail = async (m: Parameters<Mailer['send']>[0]) => d.mailer.send(m).catch((e) => d.log.warn({ err: e }, 'mail not queued'));

  async function termsOf(labId: string) {
    const t = await d.access.currentTerms(labId);
    return t ?? { version: 1, body: DEFAULT_TERMS, id: null };
  }

  async function releaseAndLab(suffix: string) {
    const rel = await d.repo.findReleaseBySuffix(suffix);
    if (!rel) throw notFound('The release');
    const dataset = (await d.repo.findDataset(rel.datasetId))!;
    const lab = (await d.labs.findById(dataset.labId))!;
    return { rel, dataset, lab };
  }

  function grantStatus(g: { expiresAt: Date | null; revokedAt: Date | null }): 'active' | 'expired' | 'revoked' {
    if (g.revokedAt) return 'revoked';
    if (g.expiresAt && g.expiresAt <= now()) return 'expired';
    return 'active';
  }

  async function views(rows: Awaited<ReturnType<AccessRepository['listRequests']>>, showEmail: boolean): Promise<AccessRequestView[]> {
    const grants = await d.access.grantsForRequests(rows.map((r) => r.request.id));
    return rows.map((r) => {
      const g = grants.find((x) => x.requestId === r.request.id);
      return {
        id: r.request.id,
        state: r.request.state,
        scope: r.request.releaseId ? 'release' : 'dataset',
        release: r.releaseSuffix ? { suffix: r.releaseSuffix, title: r.releaseTitle!, version: r.releaseVersion! } : null,
        dataset: { suffix: r.datasetSuffix, title: r.datasetTitle },
        requester: { name: r.requesterName, email: showEmail ? r.requesterEmail : null },
        purpose: r.request.purpose,
        affiliation: r.request.affiliation,
        termsVersion: r.request.termsVersion,
        createdAt: r.request.createdAt.toISOString(),
        decidedAt: r.request.decidedAt?.toISOString() ?? null,
        decisionNote: r.request.decisionNote,
        grant: g ? { id: g.id, expiresAt: g.expiresAt?.toISOString() ?? null, revokedAt: g.revokedAt?.toISOString() ?? null, status: grantStatus(g) } : null,
      };
    });
  }

  return {
    /** Whether a grant lets this user take this release's files now. */
    async hasGrant(userId: string, datasetId: string, releaseId: string) {
      return !!(await d.access.activeGrant(userId, datasetId, releaseId, now()));
    },

    async termsForRelease(suffix: string) {
      const { lab } = await releaseAndLab(suffix);
      const t = await termsOf(lab.id);
      return { labName: lab.name, version: t.version, body: t.body };
    },

    async labTerms(lab: LabContext) {
      const t = await termsOf(lab.id);
      return { version: t.version, body: t.body };
    },

    async setLabTerms(actor: Actor, lab: LabContext, body: string) {
      const current = await d.access.currentTerms(lab.id);
      // The default text is version 1, so the lab's first own text is version 2.
      const version = (current?.version ?? 1) + 1;
      await d.access.insertTerms({ id: randomUUID(), labId: lab.id, version, body, createdBy: actor.id });
      await d.access.audit({ actorId: actor.id, action: 'terms.updated', subjectType: 'lab', subjectId: lab.id, toState: `v${version}` });
      return { version, body };
    },

    async request(actor: Actor, suffix: string, input: { purpose: string; affiliation: string; scope: 'release' | 'dataset'; termsVersion: number }) {
      const { rel, dataset, lab } = await releaseAndLab(suffix);
      if (rel.withdrawnAt) throw new AppError('withdrawn', 'This release was withdrawn; its files cannot be requested.', 409);
      const openNow = rel.accessLevel === 'open' || (rel.accessLevel === 'embargoed' && rel.embargoUntil !== null && rel.embargoUntil <= now());
      if (openNow) throw new AppError('already_open', 'These files are open to everyone: download them from the release page.', 409);
      if (await d.labs.roleOf(lab.id, actor.id)) throw new AppError('lab_member', `As a member of ${lab.name} you already have the files.`, 409);
      if (await this.hasGrant(actor.id, dataset.id, rel.id)) throw new AppError('already_granted', 'You already have access to these files.', 409);
      const releaseId = input.scope === 'dataset' ? null : rel.id;
      if (await d.access.pendingFor(actor.id, dataset.id, releaseId)) {
        throw new AppError('already_pending', 'You have already asked for these files; the lab will answer that request. You can follow it on your account page.', 409);
      }
      const terms = await termsOf(lab.id);
      if (input.termsVersion !== terms.version) {
        throw new AppError('terms_changed', 'The lab changed its data-use terms while you were reading them. Read the new version and accept it again.', 409);
      }
      const id = randomUUID();
      try {
        await d.access.transaction(async (tx) => {
          await d.access.insertRequest({ id, datasetId: dataset.id, releaseId, requesterId: actor.id, purpose: input.purpose, affiliation: input.affiliation, termsVersion: terms.version, termsText: terms.body }, tx);
          await d.access.audit({ actorId: actor.id, action: 'access_request.created', subjectType: 'access_request', subjectId: id, toState: 'pending', detail: { release: rel.suffix, scope: input.scope } }, tx);
        });
      } catch (e) {
        if (/access_request_one_pending/.test(String((e as Error & { cause?: Error }).cause?.message ?? (e as Error).message))) {
          throw new AppError('already_pending', 'You have already asked for these files; the lab will answer that request.', 409);
        }
        throw e;
      }
      const deciders = (await d.labs.members(lab.id)).filter((m) => m.role === 'curator' || m.role === 'lead');
      for (const m of deciders) {
        await mail(mailTemplates.accessRequested(m.email, actor.name, input.affiliation, rel.title, lab.name, input.purpose, link(`${paths.labAccessRequests(lab.slug)}?request=${id}`)));
      }
      return { id, state: 'pending' as const };
    },

    async withdraw(actor: Actor, requestId: string) {
      const r = await d.access.findRequest(requestId);
      if (!r || r.requesterId !== actor.id) throw notFound('The request');
      if (!(await d.access.decide(r.id, { state: 'withdrawn' }))) throw new AppError('not_pending', 'Only a pending request can be withdrawn.', 409);
      await d.access.audit({ actorId: actor.id, action: 'access_request.withdrawn', subjectType: 'access_request', subjectId: r.id, fromState: 'pending', toState: 'withdrawn' });
    },

    async decide(actor: Actor, lab: LabContext, requestId: string, input: { decision: 'approve' | 'deny'; expiresOn?: string; note: string }) {
      const r = await d.access.findRequest(requestId);
      const dataset = r ? await d.repo.findDataset(r.datasetId) : undefined;
      if (!r || !dataset || dataset.labId !== lab.id) throw notFound('The request');
      const expiresAt = input.expiresOn ? new Date(`${input.expiresOn}T23:59:59Z`) : null;
      if (expiresAt && expiresAt <= now()) throw new AppError('expiry_past', 'The access would end before it starts: choose a later date.', 400, { expiresOn: 'Choose a date in the future' });
      const state = input.decision === 'approve' ? 'approved' : 'denied';
      await d.access.transaction(async (tx) => {
        const moved = await d.access.decide(r.id, { state, decidedBy: actor.id, decidedAt: now(), decisionNote: input.note || null }, tx);
        if (!moved) throw new AppError('not_pending', 'This request was already decided or withdrawn.', 409);
        if (state === 'approved') await d.access.insertGrant({ id: randomUUID(), requestId: r.id, userId: r.requesterId, datasetId: r.datasetId, releaseId: r.releaseId, expiresAt }, tx);
        await d.access.audit({ actorId: actor.id, action: `access_request.${state}`, subjectType: 'access_request', subjectId: r.id, fromState: 'pending', toState: state, detail: { expiresAt: expiresAt?.toISOString() ?? null, note: input.note } }, tx);
      });
      const [row] = await d.access.listRequests({ labId: lab.id }).then((rows) => rows.filter((x) => x.request.id === r.id));
      const title = row?.releaseTitle ?? dataset.title;
      const page = row?.releaseSuffix ? link(paths.release(row.releaseSuffix)) : link(paths.account);
      await mail(
        state === 'approved'
          ? mailTemplates.accessApproved(row.requesterEmail, title, input.expiresOn || null, input.note, page)
          : mailTemplates.accessDenied(row.requesterEmail, title, input.note, link(paths.account)),
      );
      return { state };
    },

    async revoke(actor: Actor, lab: LabContext, grantId: string) {
      const g = await d.access.findGrant(grantId);
      const dataset = g ? await d.repo.findDataset(g.datasetId) : undefined;
      if (!g || !dataset || dataset.labId !== lab.id) throw notFound('The grant');
      if (!(await d.access.revokeGrant(g.id, actor.id))) throw new AppError('already_revoked', 'This access was already withdrawn.', 409);
      await d.access.audit({ actorId: actor.id, action: 'access_grant.revoked', subjectType: 'access_request', subjectId: g.requestId, fromState: 'approved', toState: 'revoked' });
      const [row] = (await d.access.listRequests({ labId: lab.id })).filter((x) => x.request.id === g.requestId);
      if (row) await mail(mailTemplates.accessRevoked(row.requesterEmail, row.releaseTitle ?? row.datasetTitle, link(paths.account)));
    },

    /**
     * The embargo job: files of an embargoed release open at its date (the
     * access check compares the date itself); this records the lift once in
     * the audit trail and tells the lab. Returns the releases it lifted.
     */
    async liftEmbargoes(at: Date = now()) {
      const lifted: string[] = [];
      for (const { release: rel, labId } of await d.repo.embargoesDue(at)) {
        if ((await d.access.auditOf('release', rel.id)).some((e) => e.action === 'release.embargo_lifted')) continue;
        await d.access.audit({ actorId: null, action: 'release.embargo_lifted', subjectType: 'release', subjectId: rel.id, fromState: 'embargoed', toState: 'open', detail: { embargoUntil: rel.embargoUntil?.toISOString() } });
        const lab = await d.labs.findById(labId);
        const leads = (await d.labs.members(labId)).filter((m) => m.role === 'lead' || m.role === 'curator');
        for (const m of leads) await mail(mailTemplates.embargoEnded(m.email, rel.title, rel.embargoUntil!.toISOString().slice(0, 10), link(paths.release(rel.suffix))));
        d.log.info({ release: rel.suffix, lab: lab?.slug }, 'embargo lifted');
        lifted.push(rel.suffix);
      }
      return lifted;
    },

    async mine(actor: Actor) {
      return views(await d.access.listRequests({ requesterId: actor.id }), true);
    },

    async labQueue(lab: LabContext, state?: string) {
      return views(await d.access.listRequests({ labId: lab.id, state }), true);
    },

    async history(lab: LabContext, requestId: string) {
      const r = await d.access.findRequest(requestId);
      const dataset = r ? await d.repo.findDataset(r.datasetId) : undefined;
      if (!r || !dataset || dataset.labId !== lab.id) throw notFound('The request');
      return (await d.access.auditOf('access_request', r.id)).map((e) => ({ action: e.action, actorId: e.actorId, fromState: e.fromState, toState: e.toState, at: e.createdAt.toISOString() }));
    },
  };
}

export type AccessService = ReturnType<typeof createAccessService>;
