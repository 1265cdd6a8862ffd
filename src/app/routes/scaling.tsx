import { lazy, Suspense } from 'react';
import { Link } from 'react-router-dom';
import { Page } from '../../components/page';
import { Loading, QueryState } from '../../components/query-state';
import { useScalingData } from '../../features/comparison/api/get-scaling-data';
import { paths } from '../paths';

// recharts is large: load it with the plot.
const ScalingPlot = lazy(() => import('../../features/comparison/components/scaling-plot').then((m) => ({ default: m.ScalingPlot })));

export function Component() {
  const data = useScalingData();
  return (
    <Page wide title="Scaling across releases" lead="Any statistic against any other, one point per dataset (its newest release), all in SI units. Pick the axes; a power law is fitted to the points shown."
      actions={<Link to={paths.compare} className="rounded-md border border-dusk/60 bg-white px-3 py-1.5 text-sm font-medium text-dusk no-underline hover:bg-mist">Back to the comparison</Link>}>
      <QueryState query={data}>
        {(d) => (d.items.length ? <Suspense fallback={<Loading />}><ScalingPlot releases={d.items} /></Suspense> : <p>No published release has statistics yet.</p>)}
      </QueryState>
    </Page>
  );
}
