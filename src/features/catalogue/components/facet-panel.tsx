import { useEffect, useState } from 'react';
import type { FacetKey } from '../../../../shared/catalogue/facets';
import type { SearchResult } from '../../../../shared/contracts/catalogue';

const TITLES: Record<FacetKey, string> = {
  groupType: 'Group type',
  species: 'Species',
  setting: 'Setting',
  dimension: 'Dimension',
  individuals: 'Number of individuals',
  frameRate: 'Frame rate',
  lab: 'Lab',
  licence: 'Licence',
  access: 'Access',
  year: 'Year published',
};
const ORDER: FacetKey[] = ['groupType', 'species', 'setting', 'individuals', 'frameRate', 'dimension', 'lab', 'access', 'licence', 'year'];

/** Facets as real checkboxes in fieldsets; counts follow the other facets' choices. */
export function FacetPanel({ facets, selected, onToggle }: { facets: SearchResult['facets']; selected: Record<FacetKey, string[]>; onToggle: (key: FacetKey, value: string) => void }) {
  // The URL update is a deferred navigation; until it lands the box shows the click, not the old state.
  const selectedKey = JSON.stringify(selected);
  const [clicked, setClicked] = useState<{ for: string; ids: Record<string, boolean> } | null>(null);
  useEffect(() => setClicked(null), [selectedKey]);
  const pending = clicked && clicked.for === selectedKey ? clicked.ids : {};
  return (
    <div className="flex flex-col gap-5">
      {ORDER.filter((k) => facets[k].length > 0).map((key) => (
        <fieldset key={key}>
          <legend className="mb-1.5 text-sm font-semibold">{TITLES[key]}</legend>
          <ul className="flex flex-col gap-1">
            {facets[key].map((f) => {
              const id = `facet-${key}-${f.value}`.replace(/[^A-Za-z0-9_-]/g, '_');
              const checked = pending[id] ?? selected[key].includes(f.value);
              return (
                <li key={f.value} className="flex items-center gap-2 text-sm">
                  <input
                    id={id}
                    type="checkbox"
                    checked={checked}
                    onChange={(e) => {
                      const on = e.target.checked;
                      setClicked({ for: selectedKey, ids: { ...pending, [id]: on } });
                      onToggle(key, f.value);
                    }}
                    className="h-4 w-4 accent-dusk focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-dusk"
                  />
                  <label htmlFor={id} className={`flex flex-1 justify-between gap-2 ${f.count === 0 && !checked ? 'text-ink/50' : ''}`}>
                    <span className={key === 'species' ? 'italic' : ''}>{f.label}</span>
                    <span className="tabular-nums text-ink/60" aria-label={`${f.count} datasets`}>{f.count}</span>
                  </label>
                </li>
              );
            })}
          </ul>
        </fieldset>
      ))}
    </div>
  );
}
