import { MAX_COMPARED_RELEASES } from '../../../../shared/contracts/comparisons';
import { basket, useBasket } from '../basket';

/** Puts a release into (or takes it out of) the comparison being assembled in this browser. */
export function AddToComparisonButton({ suffix, title }: { suffix: string; title: string }) {
  const items = useBasket();
  const picked = items.some((i) => i.suffix === suffix);
  const full = !picked && items.length >= MAX_COMPARED_RELEASES;
  return (
    <button
      type="button"
      aria-pressed={picked}
      disabled={full}
      title={full ? `A comparison holds at most ${MAX_COMPARED_RELEASES} releases.` : undefined}
      onClick={() => (picked ? basket.remove(suffix) : basket.add({ suffix, title }))}
      className={`inline-flex items-center gap-1.5 rounded-md border px-2.5 py-1 text-sm font-medium disabled:cursor-not-allowed disabled:opacity-60 ${
        picked ? 'border-dusk bg-dusk text-paper hover:bg-dusk/90' : 'border-dusk/60 bg-white text-dusk hover:bg-mist'
      }`}
    >
      <span aria-hidden>{picked ? '✓' : '+'}</span>
      {picked ? 'In comparison' : 'Add to comparison'}
      <span className="sr-only">: {title}</span>
    </button>
  );
}
