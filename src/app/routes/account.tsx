import { Page } from '../../components/page';
import { QueryState } from '../../components/query-state';
import { FormAlert } from '../../components/form';
import { useProfile } from '../../features/account/api/get-profile';
import { ProfileForm } from '../../features/account/components/profile-form';
import { RequireSession } from '../require-session';
import { useSearchParams } from 'react-router-dom';
import { Section } from '../../components/page';
import { useMyAccess } from '../../features/access/api/get-my-access';
import { MyAccessList } from '../../features/access/components/my-access-list';
import { ApiTokens } from '../../features/account/components/api-tokens';

export function Component() {
  return <RequireSession>{() => <Account />}</RequireSession>;
}

function Account() {
  const profile = useProfile();
  const [params] = useSearchParams();
  return (
    <Page title="Your account" lead="How you appear to labs and in the citations of data you deposit.">
      {params.get('error') ? <FormAlert>That confirmation link has expired or was already used.</FormAlert> : null}
      <QueryState query={profile}>{(p) => <ProfileForm profile={p} />}</QueryState>
      <div className="mt-10">
        <Section title="Access to restricted data">
          <MyAccess />
        </Section>
        <Section title="API tokens for scripts">
          <ApiTokens />
        </Section>
      </div>
    </Page>
  );
}

function MyAccess() {
  const access = useMyAccess();
  return <QueryState query={access}>{(items) => <MyAccessList items={items} />}</QueryState>;
}
