import { Link, useNavigate } from 'react-router-dom';
import { Page } from '../../components/page';
import { SignUpForm } from '../../features/auth/components/sign-up-form';
import { paths } from '../paths';

export function Component() {
  const navigate = useNavigate();
  return (
    <Page title="Create your account" lead={<>Already have one? <Link to={paths.signIn}>Sign in</Link>.</>}>
      <div className="max-w-md">
        <SignUpForm onSignedUp={(email) => navigate(`${paths.checkEmail}?email=${encodeURIComponent(email)}`)} />
      </div>
    </Page>
  );
}
