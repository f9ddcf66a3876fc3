import { useState } from 'react';
import { matchPath, Navigate, NavLink, Outlet, useLocation, useNavigate } from 'react-router-dom';
import { ROLE_LABELS } from '@shared/schemas/roles';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useSignOut } from '@/features/auth/api/sign-out';
import { SafetyCaution } from '@/components/ui/safety-caution';
import { Notice } from '@/components/ui/notice';
import { SearchBox } from '@/features/search/components/search-box';
import type { Role } from '@shared/schemas/roles';
import { Loading } from '@/components/ui/loading';

/** Navigation, once: each entry names the roles that see it. */
const NAV: { to: string; label: string; roles: Role[] | 'all' }[] = [
  { to: paths.home.href(), label: 'Start', roles: 'all' },
  { to: paths.procedures.href(), label: 'Procedures', roles: ['technician', 'author', 'reviewer'] },
  { to: paths.reviewQueue.href(), label: 'Review queue', roles: ['reviewer'] },
  { to: paths.runs.href(), label: 'Bench runs', roles: 'all' },
  { to: paths.units.href(), label: 'Units', roles: ['technician', 'author', 'reviewer', 'admin'] },
  { to: paths.followUps.href(), label: 'Follow-ups', roles: ['technician', 'reviewer', 'admin'] },
  { to: paths.instruments.href(), label: 'Instruments', roles: 'all' },
  { to: paths.qualifications.href(), label: 'Qualifications', roles: ['technician', 'reviewer', 'admin'] },
  { to: paths.people.href(), label: 'People', roles: ['admin'] },
  { to: paths.audit.href(), label: 'Audit log', roles: ['admin'] },
  { to: paths.outbox.href(), label: 'Mail outbox', roles: ['admin'] },
  { to: paths.apiReference.href(), label: 'API', roles: ['admin'] },
];

/** The signed-in shell: header with the role's navigation, the page, the standing safety caution. */
const OWN_CAUTION = [paths.revision.pattern, paths.runSheet.pattern];

export function AppLayout() {
  const session = useSession();
  const location = useLocation();
  // On a phone the header folds to one line (brand and a menu button), so the page starts at once.
  const [menu, setMenu] = useState<{ open: boolean; at: string }>({ open: false, at: location.pathname });
  const menuOpen = menu.open && menu.at === location.pathname;
  const folded = menuOpen ? '' : 'max-md:hidden';
  const navigate = useNavigate();
  const signOut = useSignOut();

  if (session.isPending) return <Loading />;
  if (session.isError)
    return (
      <main className="mx-auto max-w-xl p-8">
        <Notice tone="error">{session.error.message}</Notice>
      </main>
    );
  const user = session.data.user;
  if (!user) return <Navigate to={paths.signIn.href(location.pathname + location.search)} replace />;
  // The shop requires an authenticator for this role: the account page is the only way on.
  if (session.data.enrolmentRequired && location.pathname !== paths.account.href())
    return <Navigate to={paths.account.href()} replace />;

  const links = NAV.filter((n) => n.roles === 'all' || hasRole(user, ...n.roles));
  return (
    <div className="flex min-h-screen flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-card focus:p-2"
      >
        Skip to content
      </a>
      <header className="no-print border-b border-rule bg-paper-deep">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
          <NavLink to={paths.home.href()} className="text-lg font-semibold tracking-tight text-accent-deep">
            Benchwright
          </NavLink>
          <button
            type="button"
            className="ml-auto min-h-11 rounded-md border border-rule bg-card px-3 text-sm md:hidden"
            aria-expanded={menuOpen}
            aria-controls="main-menu"
            onClick={() => setMenu({ open: !menuOpen, at: location.pathname })}
          >
            {menuOpen ? 'Close menu' : 'Menu'}
          </button>
          <nav id="main-menu" aria-label="Main" className={`flex flex-wrap gap-1 max-md:w-full ${folded}`}>
            {links.map((l) => (
              <NavLink
                key={l.to}
                to={l.to}
                end
                className={({ isActive }) =>
                  `rounded-md px-3 py-2 text-sm ${isActive ? 'bg-accent text-white' : 'hover:bg-paper'}`
                }
              >
                {l.label}
              </NavLink>
            ))}
          </nav>
          <div className={`max-md:w-full ${folded}`}>
            <SearchBox />
          </div>
          <div className={`ml-auto flex items-center gap-3 text-sm ${folded}`}>
            <NavLink
              to={paths.account.href()}
              className="rounded-md px-2 py-2 hover:bg-paper"
              title="Your account: password, authenticator, sessions"
            >
              {user.displayName}{' '}
              <span className="text-graphite-soft">({user.roles.map((r) => ROLE_LABELS[r]).join(', ')})</span>
            </NavLink>
            <button
              type="button"
              className="rounded-md border border-rule bg-card px-3 py-2 hover:bg-paper"
              onClick={() => signOut.mutate(undefined, { onSettled: () => navigate(paths.signIn.href()) })}
            >
              Sign out
            </button>
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-4 py-6">
        <Outlet />
      </main>
      {/* Pages that carry the caution as a sign of their own (a procedure, a run sheet) do not repeat it. */}
      {!OWN_CAUTION.some((p) => matchPath(p, location.pathname)) && (
        <footer className="no-print border-t border-rule px-4 py-4">
          <div className="mx-auto max-w-6xl">
            <SafetyCaution />
          </div>
        </footer>
      )}
    </div>
  );
}
