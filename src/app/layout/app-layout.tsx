import { useEffect, useState } from 'react';
import { Navigate, NavLink, Outlet, useLocation, useNavigation } from 'react-router-dom';
import { roleCan } from '@shared/auth/capabilities';
import type { User } from '@shared/schemas/auth';
import { Loading } from '@/components/ui/alert';
import { Wordmark } from '@/components/ui/wordmark';
import { NAV_ITEMS } from '@/config/nav';
import { paths } from '@/config/paths';
import { useSignOut } from '@/features/auth/api/sign-out';
import { useMe } from '@/lib/auth';
import { ROLE_LABEL } from '@/lib/format';

function NavList({ user, onNavigate, className = 'space-y-0.5' }: { user: User; onNavigate?: () => void; className?: string }) {
  return (
    <ul className={className}>
      {NAV_ITEMS.filter((item) => roleCan(user.role, item.capability)).map((item) => (
        <li key={item.to}>
          <NavLink
            to={item.to}
            onClick={onNavigate}
            className={({ isActive }) =>
              `flex min-h-11 flex-col justify-center rounded-md px-3 py-1.5 text-sm transition-colors ${
                isActive ? 'bg-accent text-paper-bright' : 'text-ink hover:bg-paper-deep'
              }`
            }
          >
            {({ isActive }) => (
              <>
                <span className="font-medium">{item.label}</span>
                <span className={`text-xs ${isActive ? 'text-paper-bright/80' : 'text-ink-soft'}`}>{item.hint}</span>
              </>
            )}
          </NavLink>
        </li>
      ))}
    </ul>
  );
}

function UserBox({ user, onSignOut, busy }: { user: User; onSignOut: () => void; busy: boolean }) {
  return (
    <div className="space-y-2">
      <div className="text-sm">
        <p className="truncate font-medium" title={user.email}>
          {user.name}
        </p>
        <p className="text-xs text-ink-soft">{ROLE_LABEL[user.role]}</p>
      </div>
      <button
        type="button"
        onClick={onSignOut}
        disabled={busy}
        className="min-h-9 w-full rounded-md border border-paper-edge bg-paper-bright px-3 text-sm hover:bg-paper-deep disabled:opacity-60"
      >
        {busy ? 'Signing out…' : 'Sign out'}
      </button>
    </div>
  );
}

/** The signed-in frame: side navigation on wide screens, a menu button on tablets and phones. */
export function AppLayout() {
  const me = useMe();
  const location = useLocation();
  const navigation = useNavigation();
  const signOut = useSignOut();
  // The menu is open on the page where it was opened: moving to another page closes it.
  const [menuOpenOn, setMenuOpenOn] = useState<string | null>(null);
  const menuOpen = menuOpenOn === location.pathname;
  const setMenuOpen = (open: boolean) => setMenuOpenOn(open ? location.pathname : null);
  // Esc closes the open menu.
  useEffect(() => {
    if (!menuOpen) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.key === 'Escape') setMenuOpenOn(null);
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, [menuOpen]);

  if (me.isPending) return <Loading what="Opening Lugbook" />;
  const user = me.data?.user ?? null;
  if (!user) {
    // Signing out leads to a plain sign-in page. A session that ended otherwise (expired, or
    // changed by an admin) comes back to this page after signing in again.
    const back = signOut.isIdle ? location.pathname + location.search : null;
    return <Navigate to={paths.auth.signIn.getHref(back)} replace />;
  }

  const handleSignOut = () => signOut.mutate();

  return (
    <div className="min-h-screen lg:grid lg:grid-cols-[15rem_1fr]">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-paper-bright focus:px-3 focus:py-2"
      >
        Skip to the content
      </a>
      {navigation.state !== 'idle' && (
        <div role="progressbar" aria-label="Loading the next screen" className="fixed inset-x-0 top-0 z-40 h-0.5 animate-pulse bg-accent" />
      )}

      {/* Wide screens: the side column. */}
      <div className="hidden border-r border-paper-edge bg-paper-deep/60 lg:block">
        <aside className="sticky top-0 flex h-screen flex-col p-4">
          <div className="mb-6 px-1 text-lg">
            <Wordmark />
          </div>
          <nav aria-label="Main" className="flex-1 overflow-y-auto">
            <NavList user={user} />
          </nav>
          <div className="border-t border-paper-edge pt-4">
            <UserBox user={user} onSignOut={handleSignOut} busy={signOut.isPending} />
          </div>
        </aside>
      </div>

      {/* Tablets and phones: a top bar with a menu. */}
      <header className="sticky top-0 z-30 border-b border-paper-edge bg-paper/95 backdrop-blur lg:hidden">
        <div className="flex items-center justify-between gap-3 px-4 py-2">
          <Wordmark className="text-lg" />
          <div className="flex items-center gap-3">
            <span className="hidden text-right text-sm sm:block">
              <span className="block font-medium leading-tight">{user.name}</span>
              <span className="block text-xs text-ink-soft">{ROLE_LABEL[user.role]}</span>
            </span>
            <button
              type="button"
              aria-expanded={menuOpen}
              aria-controls="mobile-nav"
              onClick={() => setMenuOpen(!menuOpen)}
              className="inline-flex min-h-11 items-center gap-2 rounded-md border border-paper-edge bg-paper-bright px-3 text-sm font-medium"
            >
              <svg viewBox="0 0 16 16" className="size-4" aria-hidden="true">
                {menuOpen ? (
                  <path d="M3.5 3.5l9 9M12.5 3.5l-9 9" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
                ) : (
                  <path d="M2.5 4h11M2.5 8h11M2.5 12h11" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
                )}
              </svg>
              Menu
            </button>
          </div>
        </div>
        {menuOpen && (
          <div id="mobile-nav" className="border-t border-paper-edge bg-paper px-4 pb-4 pt-2">
            <nav aria-label="Main">
              <NavList user={user} onNavigate={() => setMenuOpen(false)} className="grid gap-1 sm:grid-cols-2" />
            </nav>
            <div className="mt-3 border-t border-paper-edge pt-3 sm:max-w-xs">
              <UserBox user={user} onSignOut={handleSignOut} busy={signOut.isPending} />
            </div>
          </div>
        )}
      </header>

      <main id="main" tabIndex={-1} className="min-w-0 px-4 py-6 sm:px-6 lg:px-10 lg:py-8">
        <div className="mx-auto max-w-6xl">
          <Outlet />
        </div>
      </main>
    </div>
  );
}
