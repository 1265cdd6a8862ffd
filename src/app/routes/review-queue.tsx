import { Link, useParams } from 'react-router-dom';
import { Page } from '../../components/page';
import { QueryState } from '../../components/query-state';
import { useReviewQueue } from '../../features/depositing/api/get-review-queue';
import { ReviewQueue } from '../../features/depositing/components/review-queue';
import { RequireSession } from '../require-session';
import { paths } from '../paths';

export function Component() {
  const { slug = '' } = useParams();
  return (
    <RequireSession>
      {() => (
        <Page wide title="Review queue" lead={<Link to={paths.lab(slug)}>Back to the lab</Link>}>
          <Queue slug={slug} />
        </Page>
      )}
    </RequireSession>
  );
}

function Queue({ slug }: { slug: string }) {
  const q = useReviewQueue(slug);
  return <QueryState query={q}>{(items) => <ReviewQueue slug={slug} items={items} />}</QueryState>;
}
