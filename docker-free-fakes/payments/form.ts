/**
 * Decodes the provider's form encoding (`line_items[0][price]=p&expand[]=x`)
 * into nested objects and arrays, the way the provider reads what the SDK sends.
 * Values stay strings: the SDK sends numbers and booleans as text.
 */
export type FormValue = string | FormValue[] | { [key: string]: FormValue };

export function parseForm(body: string): Record<string, FormValue> {
  const root: Record<string, FormValue> = {};
  for (const [key, value] of new URLSearchParams(body)) {
    const parts = key.split(/\[|\]\[|\]/).filter((p, i) => p !== '' || i === 0);
    // `a[]` appends: give it the next index.
    const path = key.endsWith('[]') ? [...parts.filter((p) => p !== ''), ''] : parts;
    let node: Record<string, FormValue> = root;
    for (let i = 0; i < path.length - 1; i++) {
      const k = path[i];
      if (typeof node[k] !== 'object' || node[k] === null) node[k] = {};
      node = node[k] as Record<string, FormValue>;
    }
    const last = path[path.length - 1];
    node[last === '' ? String(Object.keys(node).length) : last] = value;
  }
  return arrayify(root) as Record<string, FormValue>;
}

// Objects whose keys are 0..n-1 become arrays.
function arrayify(v: FormValue): FormValue {
  if (typeof v === 'string') return v;
  if (Array.isArray(v)) return v.map(arrayify);
  const keys = Object.keys(v);
  const out: Record<string, FormValue> = {};
  for (const k of keys) out[k] = arrayify(v[k]);
  if (keys.length > 0 && keys.every((k, i) => k === String(i))) return keys.map((k) => out[k]);
  return out;
}
