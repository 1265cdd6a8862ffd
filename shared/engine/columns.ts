/** The standard columns of a trajectory file. */
export const STANDARD_COLUMNS = ['track_id', 'frame', 't', 'x', 'y', 'z', 'vx', 'vy', 'vz', 'ax', 'ay', 'az'] as const;
export type StandardColumn = (typeof STANDARD_COLUMNS)[number];

/** Explicit mapping: standard column → header name or 0-based column index. */
export type ColumnMapping = Partial<Record<StandardColumn, string | number>>;

/** Recognised header spellings (compared after lower-casing and removing spaces, '_', '-', '.' and a unit suffix). */
const ALIASES: Record<StandardColumn, string[]> = {
  track_id: ['trackid', 'track', 'id', 'tid', 'trajectory', 'trajid', 'particle', 'particleid', 'object', 'objid', 'objectid', 'individual', 'animal', 'animalid', 'fish', 'bird', 'insect'],
  frame: ['frame', 'frames', 'frameno', 'framenumber', 'framenum', 'frameid', 'f', 'fr'],
  t: ['t', 'time', 'times', 'timestamp', 'sec', 'seconds', 'tsec'],
  x: ['x', 'posx', 'xpos', 'positionx', 'px', 'x1', 'rx'],
  y: ['y', 'posy', 'ypos', 'positiony', 'py', 'x2', 'ry'],
  z: ['z', 'posz', 'zpos', 'positionz', 'pz', 'x3', 'rz'],
  vx: ['vx', 'u', 'velx', 'velocityx', 'xvel', 'ux', 'dxdt'],
  vy: ['vy', 'v', 'vely', 'velocityy', 'yvel', 'uy', 'dydt'],
  vz: ['vz', 'w', 'velz', 'velocityz', 'zvel', 'uz', 'dzdt'],
  ax: ['ax', 'accx', 'accelerationx', 'xacc'],
  ay: ['ay', 'accy', 'accelerationy', 'yacc'],
  az: ['az', 'accz', 'accelerationz', 'zacc'],
};

const UNIT_SUFFIX = /[([{]\s*(m|cm|mm|px|pixels?|s|ms|m\/s|mm\/s|cm\/s|m\/s\^?2|mm\/s\^?2|frames?)\s*[)\]}]$/;

/** Normalises a header cell for alias matching. */
export function normaliseHeader(name: string): string {
  return name
    .trim()
    .replace(/^"|"$/g, '')
    .toLowerCase()
    .replace(UNIT_SUFFIX, '')
    .replace(/[\s_\-.]/g, '');
}

/** A length unit written in a position header, e.g. "x (mm)" → 'mm'. */
export function unitFromHeader(name: string): 'm' | 'cm' | 'mm' | 'px' | null {
  const m = /[([{]\s*(m|cm|mm|px|pixels?)\s*[)\]}]\s*"?$/.exec(name.trim().toLowerCase());
  if (!m) return null;
  return m[1].startsWith('pix') ? 'px' : (m[1] as 'm' | 'cm' | 'mm' | 'px');
}

export interface ResolvedColumns {
  /** Column index of each mapped standard column. */
  index: Partial<Record<StandardColumn, number>>;
  /** Human-readable source of each mapped column (header cell or "column 3"). */
  source: Partial<Record<StandardColumn, string>>;
  problems: string[];
}

/**
 * Maps standard columns to column indices: first the explicit mapping, then
 * aliases of the header. Without a header only the explicit mapping (by
 * index) applies.
 */
export function resolveColumns(header: string[] | null, fieldCount: number, mapping: ColumnMapping = {}): ResolvedColumns {
  const index: Partial<Record<StandardColumn, number>> = {};
  const source: Partial<Record<StandardColumn, string>> = {};
  const problems: string[] = [];
  const used = new Set<number>();
  for (const [key, target] of Object.entries(mapping) as [StandardColumn, string | number][]) {
    if (!STANDARD_COLUMNS.includes(key)) {
      problems.push(`"${key}" is not a known column (known: ${STANDARD_COLUMNS.join(', ')})`);
      continue;
    }
    let i = -1;
    if (typeof target === 'number' || /^\d+$/.test(String(target))) {
      i = Number(target);
      if (i >= fieldCount) problems.push(`the mapping puts ${key} in column ${i + 1}, but the file has ${fieldCount} columns`);
    } else if (header) {
      i = header.findIndex((h) => h.trim().replace(/^"|"$/g, '') === target);
      if (i < 0) i = header.findIndex((h) => normaliseHeader(h) === normaliseHeader(String(target)));
      if (i < 0) problems.push(`the mapping names column "${target}" for ${key}, but the header has no such column (it has: ${header.join(', ')})`);
    } else {
      problems.push(`the file has no header, so ${key} must be mapped to a column number, not "${target}"`);
    }
    if (i >= 0 && i < fieldCount) {
      index[key] = i;
      source[key] = header ? header[i] : `column ${i + 1}`;
      used.add(i);
    }
  }
  if (header) {
    const norm = header.map(normaliseHeader);
    for (const key of STANDARD_COLUMNS) {
      if (index[key] !== undefined) continue;
      const i = norm.findIndex((h, k) => !used.has(k) && (h === key.replace('_', '') || ALIASES[key].includes(h)));
      if (i >= 0) {
        index[key] = i;
        source[key] = header[i];
        used.add(i);
      }
    }
  }
  return { index, source, problems };
}
