import { Link, NavLink, Outlet, useNavigate } from 'react-router-dom';
import { Suspense } from 'react';
import { useSession } from '../features/auth/api/get-session';
import { useSignOut } from '../features/auth/api/sign-out';
import { useInfo } from '../features/site/api/get-info';
import { Loading } from '../components/query-state';
import { paths } from './paths';
import { ComparisonIndicator } from '../features/comparison/components/comparison-indicator';

const navClass = ({ isActive }: { isActive: boolean }) =>
  `rounded px-2 py-1 text-sm no-underline ${isActive ? 'bg-mist font-semibold text-ink' : 'text-ink/80 hover:text-dusk'}`;

function Logo() {
  return (
    <Link to={paths.home} className="flex items-center gap-2 text-ink no-underline" aria-label="Cohesia, home">
      <svg aria-hidden viewBox="0 0 32 32" className="h-7 w-7">
        <rect width="32" height="32" rx="6" fill="#24506b" />
        <g fill="#f7f5ef">
          <circle cx="10" cy="12" r="2.4" /><circle cx="17" cy="9" r="2" /><circle cx="22" cy="15" r="2.4" />
          <circle cx="14" cy="19" r="2.2" /><circle cx="20" cy="23" r="1.8" /><circle cx="9" cy="22" r="1.6" />
        </g>
      </svg>
      <span className="font-serif text-xl font-bold">Cohesia</span>
    </Link>
  );
}

export function Layout() {
  const session = useSession();
  const info = useInfo();
  const signOut = useSignOut();
  const navigate = useNavigate();
  const user = session.data;

  return (
    <div className="flex min-h-screen flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-white focus:p-2">Skip to content</a>
      {info.data?.demo ? (
        <div className="bg-plum px-4 py-1 text-center text-xs text-white">
          <span aria-hidden>◇ </span>Demo installation: the labs, people and data here are synthetic, and identifiers (prefix {info.data.doiPrefix}) are not registered.
        </div>
      ) : null}
      <header className="border-b border-mist bg-white">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-4 px-4 py-3">
          <Logo />
          <nav aria-label="Main" className="flex flex-1 flex-wrap items-center gap-1">
            <NavLink to={paths.catalogue} className={navClass}>Catalogue</NavLink>
            <ComparisonIndicator className={navClass} />
            {user ? <NavLink to={paths.myLabs} end className={navClass}>My labs</NavLink> : null}
            {user?.role === 'admin' ? (
              <>
                <NavLink to={paths.adminUsers} className={navClass}>Accounts</NavLink>
                <NavLink to={paths.adminLabs} className={navClass}>All labs</NavLink>
                <NavLink to={paths.adminPlans} className={navClass}>Plans</NavLink>
                <NavLink to={paths.adminAudit} className={navClass}>Audit log</NavLink>
              </>
            ) : null}
            {info.data?.mailbox ? <NavLink to={paths.mailbox} className={navClass}>Mailbox</NavLink> : null}
          </nav>
          <div className="flex items-center gap-2 text-sm">
            {user ? (
              <>
                <NavLink to={paths.account} className={navClass}>{user.name}</NavLink>
                <button
                  type="button"
                  className="rounded px-2 py-1 text-dusk hover:underline"
                  onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate(paths.home) })}
                >
                  Sign out
                </button>
              </>
            ) : session.isPending ? null : (
              <>
                <NavLink to={paths.signIn} className={navClass}>Sign in</NavLink>
                <Link to={paths.signUp} className="rounded-md bg-dusk px-3 py-1.5 text-paper no-underline">Create account</Link>
              </>
            )}
          </div>
        </div>
      </header>
      <main id="main" className="flex-1">
        <Suspense fallback={<div className="mx-auto max-w-3xl px-4"><Loading /></div>}>
          <Outlet />
        </Suspense>
      </main>
      <footer className="border-t border-mist bg-white">
        <div className="mx-auto max-w-6xl px-4 py-4 text-xs text-ink/70">
          Cohesia — trajectory data of animal groups, deposited by labs, released with identifiers, compared across studies. ·{' '}
          <Link to={paths.apiDocs}>API for scripts</Link>
        </div>
      </footer>
    </div>
  );
}
