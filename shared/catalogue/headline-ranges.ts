import type { Highlighted } from '../contracts/catalogue';

export const MARK_START = '\u0002';
export const MARK_END = '\u0003';

/**
 * Turns text whose matches are wrapped in MARK_START…MARK_END (as the
 * database's headline function writes them) into plain text plus
 * [start, end) ranges, so no markup ever reaches the page. Unbalanced marks
 * are dropped.
 */
export function headlineRanges(marked: string): Highlighted {
  let text = '';
  const highlights: Array<[number, number]> = [];
  let open: number | null = null;
  for (const ch of marked) {
    if (ch === MARK_START) open = text.length;
    else if (ch === MARK_END) {
      if (open !== null && text.length > open) highlights.push([open, text.length]);
      open = null;
    } else text += ch;
  }
  return { text, highlights };
}
