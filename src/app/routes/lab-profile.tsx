import { Link, useParams } from 'react-router-dom';
import { QueryState } from '../../components/query-state';
import { useLabProfile } from '../../features/lab-profiles/api/get-lab-profile';
import { LabProfileView } from '../../features/lab-profiles/components/lab-profile-view';
import { MemberListingToggle } from '../../features/lab-profiles/components/member-listing-toggle';
import { paths } from '../paths';

/** The lab's public page; its members also find their listing choice and the way to the management page here. */
export function Component() {
  const { slug = '' } = useParams();
  const profile = useLabProfile(slug);
  return (
    <QueryState query={profile}>
      {(p) => (
        <>
          <LabProfileView p={p} />
          {p.myListing !== null ? (
            <div className="mx-auto mb-10 flex max-w-4xl flex-col gap-3 px-4">
              <MemberListingToggle slug={p.slug} />
              <Link to={paths.lab(p.slug)} className="text-sm">Members, invitations and lab work</Link>
            </div>
          ) : null}
        </>
      )}
    </QueryState>
  );
}
