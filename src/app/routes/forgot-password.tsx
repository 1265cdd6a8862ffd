import { Page } from '../../components/page';
import { ForgotPasswordForm } from '../../features/auth/components/forgot-password-form';

export function Component() {
  return (
    <Page title="Forgot your password?" lead="Enter your address and we will send you a link to choose a new one.">
      <div className="max-w-md">
        <ForgotPasswordForm />
      </div>
    </Page>
  );
}
