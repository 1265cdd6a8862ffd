import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import { useSession, type SessionUser } from '../features/auth/api/get-session';
import { Loading } from '../components/query-state';
import { Page } from '../components/page';
import { paths } from './paths';

/** Renders children for a signed-in user (optionally an admin); otherwise sends them to sign in. */
export function RequireSession({ admin, children }: { admin?: boolean; children: (user: SessionUser) => ReactNode }) {
  const session = useSession();
  const location = useLocation();
  if (session.isPending) return <Loading />;
  if (!session.data) return <Navigate to={`${paths.signIn}?next=${encodeURIComponent(location.pathname + location.search)}`} replace />;
  if (admin && session.data.role !== 'admin') {
    return (
      <Page title="Not available">
        <p>This page is for the platform's administrators.</p>
      </Page>
    );
  }
  return <>{children(session.data)}</>;
}
