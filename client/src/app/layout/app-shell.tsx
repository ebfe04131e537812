import { useState } from 'react';
import { Form, NavLink, Outlet, useLocation, useNavigation } from 'react-router-dom';
import { Button } from '../../components/button';
import { LoadingState } from '../../components/query-states';
import { RunModeProvider, useRunModeActive } from '../../components/run-mode';
import { paths } from '../../config/paths';
import { HealthStatus } from '../../features/health/components/health-status';
import { ROLE_LABELS } from '../../features/users/components/role-labels';
import { useUser } from '../../lib/auth';
import { can, type Permission } from '../../lib/permissions';

interface NavItem {
  to: string;
  label: string;
  end?: boolean;
  permission?: Permission;
}

const NAV: NavItem[] = [
  { to: paths.home.href(), label: 'Home', end: true },
  { to: paths.newRun.href(), label: 'New run', permission: 'plans:read' },
  { to: paths.projects.href(), label: 'Projects' },
  { to: paths.organizations.href(), label: 'Organisations', permission: 'organizations:read' },
  // 'plans:read' grants the staff roles (admin, engineer, operator), who are the register's readers.
  { to: paths.instruments.href(), label: 'Instruments', permission: 'plans:read' },
  { to: paths.rigs.href(), label: 'Rigs', permission: 'plans:read' },
  { to: paths.users.href(), label: 'Users', permission: 'users:manage' },
  { to: paths.reports.href(), label: 'Reports' },
  // 'users:manage' is the admin-only grant; the mailbox is for admins.
  { to: paths.mailbox.href(), label: 'Mailbox', permission: 'users:manage' },
  { to: paths.account.href(), label: 'My account' },
];

const navLinkClass = ({ isActive }: { isActive: boolean }) =>
  `inline-flex min-h-touch items-center rounded-md px-3 font-semibold no-underline ${isActive ? 'bg-neutral-900 text-white' : 'text-neutral-950 hover:bg-neutral-200'}`;

function SignOutButton() {
  const navigation = useNavigation();
  return (
    <Form method="post" action={paths.signOut.href()} replace>
      <Button type="submit" variant="secondary" busy={navigation.formAction === paths.signOut.href()} busyLabel="Signing out…">
        Sign out
      </Button>
    </Form>
  );
}

/** The frame of every signed-in page: header and navigation, then the page. Cautions stand with results, on the pages that show them. */
export function AppShell() {
  return (
    <RunModeProvider>
      <Frame />
    </RunModeProvider>
  );
}

function Frame() {
  const user = useUser();
  const navigation = useNavigation();
  const runMode = useRunModeActive();
  const { pathname } = useLocation();
  // The menu opened on one page folds again on the next, so run mode stays run mode.
  const [menuOpenOn, setMenuOpenOn] = useState<string | null>(null);
  const menuOpen = menuOpenOn === pathname;
  // Only for a moment: the layout loader, the session-ended handler and sign-out all move on to sign-in.
  if (!user) return <LoadingState label="Checking your session…" />;
  const showMenu = !runMode || menuOpen;
  return (
    <div className="flex min-h-dvh flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-10 focus:bg-white focus:p-2">
        Skip to the page
      </a>
      <HealthStatus />
      <header className="border-b-2 border-neutral-300 bg-neutral-100">
        <div className={`mx-auto flex max-w-7xl flex-wrap items-center justify-between gap-2 px-4 ${runMode ? 'py-1' : 'py-2'}`}>
          <span className="font-mono text-xl font-bold tracking-tight">Settlescope</span>
          <div className="flex items-center gap-3">
            {runMode && (
              <Button variant="secondary" aria-expanded={menuOpen} aria-controls="site-menu" onClick={() => setMenuOpenOn(menuOpen ? null : pathname)}>
                {menuOpen ? 'Hide menu' : 'Menu'}
              </Button>
            )}
            {showMenu && (
              <>
                <span className="hidden text-right sm:block">
                  <span className="block font-semibold">{user.name}</span>
                  <span className="block text-sm text-neutral-800">{ROLE_LABELS[user.role]}</span>
                </span>
                <SignOutButton />
              </>
            )}
          </div>
        </div>
        {showMenu && (
          <nav id="site-menu" aria-label="Main" className="mx-auto max-w-7xl px-2 pb-2">
            <ul className="flex flex-wrap gap-1">
              {NAV.filter((item) => !item.permission || can(user.role, item.permission)).map((item) => (
                <li key={item.to}>
                  <NavLink to={item.to} end={item.end} className={navLinkClass}>
                    {item.label}
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>
        )}
      </header>
      {navigation.state === 'loading' && (
        <p role="status" className="bg-neutral-900 px-4 py-1 text-center font-semibold text-white">
          Loading…
        </p>
      )}
      <main id="main" className={`mx-auto w-full max-w-7xl grow px-4 ${runMode ? 'pt-0 pb-6' : 'py-6'}`}>
        <Outlet />
      </main>
    </div>
  );
}
