import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { Page } from '../../components/page';
import { SignInForm } from '../../features/auth/components/sign-in-form';
import { paths } from '../paths';

// Only same-site paths are followed after sign-in.
const safeNext = (next: string | null) => (next && next.startsWith('/') && !next.startsWith('//') ? next : paths.myLabs);

export function Component() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  return (
    <Page title="Sign in" lead={<>New here? <Link to={paths.signUp}>Create an account</Link>.</>}>
      <div className="max-w-md">
        <SignInForm onSignedIn={() => navigate(safeNext(params.get('next')), { replace: true })} />
      </div>
    </Page>
  );
}
