import { useSearchParams } from 'react-router-dom';
import { Page } from '../../components/page';
import { Button } from '../../components/button';
import { FormAlert } from '../../components/form';
import { useSendVerification } from '../../features/auth/api/send-verification';
import { useInfo } from '../../features/site/api/get-info';
import { paths } from '../paths';

export function Component() {
  const [params] = useSearchParams();
  const email = params.get('email') ?? '';
  const resend = useSendVerification();
  const info = useInfo();
  return (
    <Page title="Check your e-mail">
      <div className="flex max-w-xl flex-col gap-4">
        <p>
          We have sent a link to <strong>{email || 'your address'}</strong>. Open it to confirm the address; you will then be signed in.
        </p>
        {info.data?.mailbox ? (
          <FormAlert tone="info">
            This installation delivers mail to its local capture: read it in the <a href={paths.mailbox}>mailbox</a>.
          </FormAlert>
        ) : null}
        {resend.isSuccess ? <FormAlert tone="success">A new link is on its way.</FormAlert> : null}
        {email ? (
          <div>
            <Button variant="secondary" onClick={() => resend.mutate(email)} busy={resend.isPending}>Send the link again</Button>
          </div>
        ) : null}
      </div>
    </Page>
  );
}
