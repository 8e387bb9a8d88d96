import { useEffect, useRef } from 'react';
import { NavLink, Outlet, useLocation, useNavigate, useNavigation } from 'react-router-dom';
import { Button } from '../components/button';
import { SquarewrightMark } from '../components/mark';
import { useSignOut } from '../features/auth/api/sign-out';
import { roleLabel } from '../lib/roles';
import { navByRole } from './nav';
import { useSessionUser } from './role-guard';
import { useSessionExpiry } from './use-session-expiry';

/** The signed-in frame: header (mark, name, user, sign out), the role's navigation, and the page. */
export function AppLayout() {
  const user = useSessionUser();
  const navigate = useNavigate();
  const navigation = useNavigation();
  const signOut = useSignOut();
  const items = navByRole[user.role];
  useSessionExpiry();
  const location = useLocation();
  const mainRef = useRef<HTMLElement>(null);
  const firstPath = useRef(location.pathname);
  // After moving to another page, put the keyboard focus at the start of the new content.
  useEffect(() => {
    if (location.pathname === firstPath.current) return;
    firstPath.current = '';
    mainRef.current?.focus({ preventScroll: true });
  }, [location.pathname]);
  return (
    <div className="flex min-h-dvh flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-50 focus:rounded-md focus:bg-surface focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <header className="flex items-center justify-between gap-4 border-b border-rule bg-surface px-5 py-3">
        <NavLink to="/" className="flex items-center gap-2.5 text-ink no-underline">
          <SquarewrightMark size={30} />
          <span className="text-lg font-semibold tracking-tight">Squarewright</span>
        </NavLink>
        <div className="flex items-center gap-3 text-sm">
          <span className="hidden text-right sm:block">
            <span className="block font-medium text-ink">{user.name || user.email}</span>
            <span className="block text-ink-muted">
              {roleLabel[user.role]} · {user.email}
            </span>
          </span>
          <Button
            size="sm"
            busy={signOut.isPending}
            onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate('/sign-in', { replace: true }) })}
          >
            Sign out
          </Button>
        </div>
      </header>
      <div className="flex flex-1 flex-col lg:flex-row">
        <nav aria-label="Main" className="border-b border-rule bg-paper-deep/60 lg:w-56 lg:shrink-0 lg:border-r lg:border-b-0">
          <ul className="flex gap-1 overflow-x-auto px-3 py-2 lg:flex-col lg:px-3 lg:py-5">
            {items.map((item) => (
              <li key={item.to}>
                <NavLink
                  to={item.to}
                  end={item.to === '/'}
                  className={({ isActive }) =>
                    `block rounded-md px-3 py-1.5 text-sm whitespace-nowrap no-underline focus-visible:outline-2 focus-visible:outline-focus ${
                      isActive ? 'bg-surface font-semibold text-ink shadow-[inset_3px_0_0_var(--color-accent)]' : 'text-ink-soft hover:bg-surface hover:text-ink'
                    }`
                  }
                >
                  {item.label}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
        <main ref={mainRef} id="main" tabIndex={-1} className="flex-1 outline-none px-5 py-6 lg:px-10 lg:py-8" aria-busy={navigation.state === 'loading' || undefined}>
          <div className="mx-auto max-w-6xl">
            <Outlet />
          </div>
        </main>
      </div>
      <footer className="border-t border-rule px-5 py-3 text-xs text-ink-muted">Squarewright · Larkspur &amp; Quill Press</footer>
    </div>
  );
}
