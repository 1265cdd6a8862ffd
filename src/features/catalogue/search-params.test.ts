import { describe, expect, it } from 'vitest';
import { readCatalogueState, toggleFilter, writeCatalogueState } from './search-params';

describe('catalogue URL state', () => {
  it('reads words, sort and repeated facet values from the URL', () => {
    const s = readCatalogueState(new URLSearchParams('q=swarm&sort=newest&groupType=swarm&groupType=school&setting=field'));
    expect(s.q).toBe('swarm');
    expect(s.sort).toBe('newest');
    expect(s.filters.groupType).toEqual(['swarm', 'school']);
    expect(s.filters.setting).toEqual(['field']);
    expect(s.filters.lab).toEqual([]);
  });
  it('ignores an unknown sort', () => expect(readCatalogueState(new URLSearchParams('sort=random')).sort).toBeNull());
  it('writes back what it read, and drops relevance without words', () => {
    const qs = 'q=swarm&sort=newest&groupType=swarm&groupType=school';
    expect(writeCatalogueState(readCatalogueState(new URLSearchParams(qs))).toString()).toBe(qs);
    expect(writeCatalogueState(readCatalogueState(new URLSearchParams('sort=relevance'))).toString()).toBe('');
  });
  it('toggles a facet value on and off', () => {
    const s = readCatalogueState(new URLSearchParams(''));
    const on = toggleFilter(s, 'species', 'Danio rerio');
    expect(on.filters.species).toEqual(['Danio rerio']);
    expect(toggleFilter(on, 'species', 'Danio rerio').filters.species).toEqual([]);
  });
});
