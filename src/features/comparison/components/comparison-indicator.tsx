import { NavLink } from 'react-router-dom';
import { paths } from '../../../../shared/paths';
import { useBasket } from '../basket';

/** The header's link to the comparison, with how many releases are picked. */
export function ComparisonIndicator({ className }: { className: (s: { isActive: boolean }) => string }) {
  const n = useBasket().length;
  return (
    <NavLink to={paths.compare} end className={className} aria-label={`Compare, ${n} release${n === 1 ? '' : 's'} picked`}>
      Compare
      {n ? <span className="ml-1.5 rounded-full bg-dusk px-1.5 text-xs font-semibold tabular-nums text-paper" data-testid="comparison-count">{n}</span> : null}
    </NavLink>
  );
}
