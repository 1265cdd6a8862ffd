import { AppError, notFound } from '../errors';
import type { ComparableRelease, ComparisonsRepository } from '../repositories/comparisons.repository';
import { pickRepresentativeFile, releaseCurves, releaseScalars } from '../../shared/comparison/release-scalars';
import type { ComparedRelease, ComparisonInput, ComparisonView } from '../../shared/contracts';

type Deps = { repo: ComparisonsRepository };
type Meta = { groupType?: string; species?: Array<{ name: string }> };

/**
 * The same rule as the landing page (releases.service `landing`): metadata and statistics
 * of every release are public at every access level; a withdrawn release keeps only its citation.
 */
const statisticsVisible = (r: ComparableRelease) => !r.withdrawn;

function row(r: ComparableRelease): ComparedRelease {
  const file = pickRepresentativeFile(r.files);
  const params = (file?.result as { parameters?: { units?: string; metresPerUnit?: number } } | undefined)?.parameters;
  const m = r.metadata as Meta;
  return {
    suffix: r.suffix,
    doi: r.doi,
    title: r.title,
    version: r.version,
    accessLevel: r.accessLevel,
    lab: r.lab,
    groupType: m.groupType ?? null,
    species: (m.species ?? []).map((s) => s.name),
    fileName: file?.fileName ?? null,
    declaredUnit: params?.units ?? null,
    metresPerUnit: typeof params?.metresPerUnit === 'number' ? params.metresPerUnit : null,
    scalars: releaseScalars(file?.result),
  };
}

/** Comparisons of releases (unsaved and saved), and the scaling view over every public release. */
export function createComparisonsService({ repo }: Deps) {
  /** The releases of `suffixes` in that order; unknown suffixes are a 400 naming them. */
  async function load(suffixes: string[]) {
    const found = await repo.releasesBySuffix(suffixes);
    const bySuffix = new Map(found.map((r) => [r.suffix, r]));
    const unknown = suffixes.filter((s) => !bySuffix.has(s));
    if (unknown.length)
      throw new AppError('unknown_release', `${unknown.length === 1 ? 'There is no release' : 'There are no releases'} ${unknown.map((s) => `"${s}"`).join(', ')}.`, 400, { releases: unknown.join(', ') });
    return suffixes.map((s) => bySuffix.get(s)!);
  }

  function view(releases: ComparableRelease[], saved: null | { id: string; title: string; ownerName: string; mine: boolean; createdAt: Date; updatedAt: Date }): ComparisonView {
    const visible = releases.filter(statisticsVisible);
    return {
      id: saved?.id ?? null,
      title: saved?.title ?? null,
      owner: saved ? { name: saved.ownerName } : null,
      mine: saved?.mine ?? false,
      createdAt: saved?.createdAt.toISOString() ?? null,
      updatedAt: saved?.updatedAt.toISOString() ?? null,
      releases: visible.map(row),
      curves: visible.map((r) => releaseCurves(r.suffix, pickRepresentativeFile(r.files)?.result)),
      hidden: releases.length - visible.length,
    };
  }

  async function owned(actorId: string, id: string) {
    const found = await repo.find(id);
    if (!found) throw notFound('The comparison');
    if (found.comparison.ownerId !== actorId) throw new AppError('not_owner', 'Only the person who saved this comparison can change it.', 403);
    return found.comparison;
  }

  const summary = (c: { id: string; title: string; releaseSuffixes: string[]; createdAt: Date; updatedAt: Date }) => ({
    id: c.id,
    title: c.title,
    releases: c.releaseSuffixes,
    createdAt: c.createdAt.toISOString(),
    updatedAt: c.updatedAt.toISOString(),
  });

  return {
    /** An unsaved comparison (the browser's basket). */
    async compare(suffixes: string[]) {
      return view(await load(suffixes), null);
    },

    /** A saved comparison, for anyone with its link, limited to the releases this viewer may see. */
    async get(id: string, viewerId: string | null) {
      const found = await repo.find(id);
      if (!found) throw notFound('The comparison');
      const c = found.comparison;
      const releases = await repo.releasesBySuffix(c.releaseSuffixes);
      const bySuffix = new Map(releases.map((r) => [r.suffix, r]));
      const ordered = c.releaseSuffixes.map((s) => bySuffix.get(s) ?? { suffix: s, withdrawn: true } as ComparableRelease);
      return view(ordered, { id: c.id, title: c.title, ownerName: found.ownerName, mine: viewerId === c.ownerId, createdAt: c.createdAt, updatedAt: c.updatedAt });
    },

    async create(actorId: string, input: ComparisonInput) {
      const releases = await load(input.releases);
      const hidden = releases.filter((r) => !statisticsVisible(r)).map((r) => `"${r.suffix}"`);
      if (hidden.length) throw new AppError('withdrawn_release', `These releases were withdrawn and cannot be compared: ${hidden.join(', ')}.`, 400);
      return summary(await repo.insert({ id: crypto.randomUUID(), ownerId: actorId, title: input.title, releaseSuffixes: input.releases }));
    },

    async update(actorId: string, id: string, input: ComparisonInput) {
      await owned(actorId, id);
      await load(input.releases);
      return summary(await repo.update(id, { title: input.title, releaseSuffixes: input.releases }));
    },

    async remove(actorId: string, id: string) {
      await owned(actorId, id);
      await repo.remove(id);
    },

    async list(actorId: string) {
      return { items: (await repo.listOf(actorId)).map(summary) };
    },

    /** One row per dataset (its newest public release) for the scaling view. */
    async scaling() {
      const rows = (await repo.newestReleases()).filter(statisticsVisible).map(row);
      return { items: rows.filter((r) => r.fileName !== null) };
    },
  };
}

export type ComparisonsService = ReturnType<typeof createComparisonsService>;
