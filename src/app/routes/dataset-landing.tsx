import { Navigate, useParams } from 'react-router-dom';
import { QueryState } from '../../components/query-state';
import { useDatasetVersions } from '../../features/releases/api/get-dataset-versions';
import { paths } from '../paths';

// The all-versions page shows the newest release.
export function Component() {
  const { suffix = '' } = useParams();
  const versions = useDatasetVersions(suffix);
  return <QueryState query={versions}>{(v) => <Navigate to={paths.release(v.latest)} replace />}</QueryState>;
}
