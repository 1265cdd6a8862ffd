import { Link } from 'react-router-dom';
import { Page } from '../../components/page';
import { paths } from '../paths';

export function Component() {
  return (
    <Page title="Page not found">
      <p>There is nothing at this address. <Link to={paths.home}>Go to the home page</Link>.</p>
    </Page>
  );
}
