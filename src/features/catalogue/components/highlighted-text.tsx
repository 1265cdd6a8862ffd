import type { Highlighted } from '../../../../shared/contracts/catalogue';

/** Text with its matched spans in <mark>, built from offsets: the text is never parsed as HTML. */
export function HighlightedText({ value }: { value: Highlighted }) {
  const parts: Array<{ text: string; mark: boolean }> = [];
  let at = 0;
  for (const [start, end] of value.highlights) {
    if (start < at || end > value.text.length) continue;
    if (start > at) parts.push({ text: value.text.slice(at, start), mark: false });
    parts.push({ text: value.text.slice(start, end), mark: true });
    at = end;
  }
  if (at < value.text.length) parts.push({ text: value.text.slice(at), mark: false });
  return (
    <>
      {parts.map((p, i) => (p.mark ? <mark key={i} className="rounded-sm bg-[#f6e7b0] px-0.5 text-ink">{p.text}</mark> : <span key={i}>{p.text}</span>))}
    </>
  );
}
