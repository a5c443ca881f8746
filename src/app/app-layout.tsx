import { useQueryClient } from '@tanstack/react-query';
import { NavLink, Outlet, useNavigation } from 'react-router-dom';
import { useMe } from '../features/auth/api/get-me.ts';
import { useSignOut } from '../features/auth/api/sign-out.ts';
import { runSignOutSteps } from '../lib/session-end.ts';

const navLinkClass = ({ isActive }: { isActive: boolean }) =>
  `rounded px-2 py-1 font-medium ${isActive ? 'bg-accent-soft text-accent' : 'text-ink hover:bg-accent-soft'}`;

/**
 * The frame of every signed-in page: a slim header and the page below it.
 *
 * Height: the frame is exactly the viewport (`h-dvh flex flex-col`); the header does not shrink and
 * `main` takes the rest (`flex-1 min-h-0`). `main` is itself a column, so a page can claim the
 * whole remaining height with `flex-1 min-h-0` (or `h-full`) and scroll inside itself, as the board
 * console does; a taller page of ordinary content (jobs, admin) scrolls within `main` instead, and
 * the header stays put either way.
 */
export function AppLayout() {
  const { data: me } = useMe();
  const signOut = useSignOut();
  const queryClient = useQueryClient();
  const navigation = useNavigation();
  // Once signed out, no board engine may send anything more under the ended session; what waits
  // stays stored under the person who typed it, for their next sign-in.
  const signOutAndStopSync = () => signOut.mutate(undefined, { onSuccess: () => runSignOutSteps(queryClient) });

  return (
    <div className="flex h-dvh flex-col">
      <a
        href="#main"
        className="sr-only rounded bg-accent px-2 py-1 text-white focus:not-sr-only focus:absolute focus:top-1 focus:left-1 focus:z-50"
      >
        Skip to the page
      </a>
      <header className="flex h-10 shrink-0 items-center gap-4 border-b border-line bg-surface px-3">
        <span className="font-semibold tracking-tight">Boardwalk</span>
        <nav aria-label="Main" className="flex items-center gap-1">
          <NavLink to="/jobs" className={navLinkClass}>
            Jobs
          </NavLink>
          {(me?.role === 'reviewer' || me?.role === 'admin') && (
            <NavLink to="/review" className={navLinkClass}>
              Review
            </NavLink>
          )}
          {me?.role === 'admin' && (
            <NavLink to="/admin" className={navLinkClass}>
              Admin
            </NavLink>
          )}
        </nav>
        {navigation.state !== 'idle' && (
          <span role="status" className="text-muted">
            Loading…
          </span>
        )}
        <div className="ml-auto flex items-center gap-3">
          {me && (
            <span>
              <span className="font-medium">{me.name}</span>{' '}
              <span className="rounded border border-line px-1.5 py-px text-xs text-muted capitalize">{me.role}</span>
            </span>
          )}
          {me && (
            <NavLink to="/account/password" className={navLinkClass}>
              Password
            </NavLink>
          )}
          {signOut.isError && (
            <span role="alert" className="text-danger">
              Sign-out failed: {signOut.error.message}
            </span>
          )}
          <button
            type="button"
            onClick={signOutAndStopSync}
            aria-disabled={signOut.isPending || undefined}
            className="rounded border border-line-strong px-2 py-0.5 font-medium hover:bg-accent-soft aria-disabled:opacity-70"
          >
            {signOut.isPending ? 'Signing out…' : 'Sign out'}
          </button>
        </div>
      </header>
      <main id="main" tabIndex={-1} className="flex min-h-0 flex-1 flex-col overflow-auto focus:outline-none">
        <Outlet />
      </main>
    </div>
  );
}
