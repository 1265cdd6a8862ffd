import { Link, useSearchParams } from 'react-router-dom';
import { Page } from '../../components/page';
import { FormAlert } from '../../components/form';
import { ResetPasswordForm } from '../../features/auth/components/reset-password-form';
import { paths } from '../paths';

export function Component() {
  const [params] = useSearchParams();
  const token = params.get('token');
  const error = params.get('error');
  return (
    <Page title="Choose a new password">
      <div className="max-w-md">
        {token && !error ? (
          <ResetPasswordForm token={token} />
        ) : (
          <FormAlert>
            This link has expired or is not valid. <Link to={paths.forgotPassword}>Ask for a new one</Link>.
          </FormAlert>
        )}
      </div>
    </Page>
  );
}
