import { useSyncExternalStore } from 'react';
import { MAX_COMPARED_RELEASES } from '../../../shared/contracts/comparisons';

/** A release picked for comparison before the comparison is saved. */
export type BasketItem = { suffix: string; title: string };

const KEY = 'cohesia.comparison-basket';
const listeners = new Set<() => void>();
let cached: { raw: string | null; items: BasketItem[] } = { raw: null, items: [] };

function read(): BasketItem[] {
  const raw = typeof localStorage === 'undefined' ? null : localStorage.getItem(KEY);
  if (raw === cached.raw) return cached.items;
  let items: BasketItem[] = [];
  try {
    const parsed = raw ? JSON.parse(raw) : [];
    // Another tab or an older version may have written it: keep only well-formed entries.
    if (Array.isArray(parsed)) items = parsed.filter((i) => i && typeof i.suffix === 'string' && typeof i.title === 'string').slice(0, MAX_COMPARED_RELEASES);
  } catch {
    items = [];
  }
  cached = { raw, items };
  return items;
}

function write(items: BasketItem[]) {
  localStorage.setItem(KEY, JSON.stringify(items));
  listeners.forEach((l) => l());
}

function subscribe(l: () => void) {
  listeners.add(l);
  // Picks made in another tab show here too.
  const onStorage = (e: StorageEvent) => e.key === KEY && l();
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(l);
    window.removeEventListener('storage', onStorage);
  };
}

export const basket = {
  add(item: BasketItem): boolean {
    const items = read();
    if (items.some((i) => i.suffix === item.suffix)) return true;
    if (items.length >= MAX_COMPARED_RELEASES) return false;
    write([...items, item]);
    return true;
  },
  remove(suffix: string) {
    write(read().filter((i) => i.suffix !== suffix));
  },
  replace(items: BasketItem[]) {
    write(items.slice(0, MAX_COMPARED_RELEASES));
  },
  clear() {
    write([]);
  },
};

/** The picked releases, kept in step with localStorage. */
export function useBasket(): BasketItem[] {
  return useSyncExternalStore(subscribe, read, () => []);
}
