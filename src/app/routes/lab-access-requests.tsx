import { useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { Page, Section } from '../../components/page';
import { QueryState } from '../../components/query-state';
import { useLab } from '../../features/labs/api/get-lab';
import { useLabAccessRequests } from '../../features/access/api/get-lab-access-requests';
import { AccessQueue } from '../../features/access/components/access-queue';
import { TermsEditor } from '../../features/access/components/terms-editor';
import { labRoleCan } from '../../../shared/lab-roles';
import { RequireSession } from '../require-session';
import { paths } from '../paths';

const FILTERS = [
  ['pending', 'Waiting'],
  ['approved', 'Approved'],
  ['denied', 'Declined'],
  ['', 'All'],
] as const;

export function Component() {
  const { slug = '' } = useParams();
  return <RequireSession>{() => <Requests slug={slug} />}</RequireSession>;
}

function Requests({ slug }: { slug: string }) {
  const [params] = useSearchParams();
  const [state, setState] = useState<string>(params.get('request') ? '' : 'pending');
  const lab = useLab(slug);
  const items = useLabAccessRequests(slug, state);
  return (
    <Page wide title="Access requests" lead={<Link to={paths.lab(slug)}>Back to the lab</Link>}>
      <div className="mb-4 flex flex-wrap gap-1" role="tablist" aria-label="Filter by state">
        {FILTERS.map(([value, label]) => (
          <button key={value} role="tab" aria-selected={state === value} onClick={() => setState(value)} className={`rounded px-3 py-1 text-sm ${state === value ? 'bg-dusk text-paper' : 'text-dusk hover:bg-mist'}`}>
            {label}
          </button>
        ))}
      </div>
      <QueryState query={items}>{(list) => <AccessQueue slug={slug} items={list} highlight={params.get('request')} />}</QueryState>
      <Section title="Data-use terms">
        <TermsEditor slug={slug} canEdit={labRoleCan(lab.data?.myRole, { lab: ['update'] })} />
      </Section>
    </Page>
  );
}
