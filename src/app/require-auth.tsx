import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import { useMe } from '../features/auth/api/get-me.ts';
import type { SignInLocationState } from '../features/auth/components/sign-in-page.tsx';
import { FullPageMessage } from './full-page-message.tsx';

/**
 * Shows its children only to a signed-in person. Anyone else goes to the sign-in page, which
 * brings them back to this very page (path, query and hash) afterwards.
 */
export function RequireAuth({ children }: { children: ReactNode }) {
  const location = useLocation();
  const me = useMe();

  if (me.isPending) {
    return (
      <div className="flex h-dvh flex-col">
        <FullPageMessage title="Opening Boardwalk…" />
      </div>
    );
  }
  if (me.isError) {
    return (
      <div className="flex h-dvh flex-col">
        <FullPageMessage title="Boardwalk cannot reach its server">
          <p className="text-muted">{me.error.message}</p>
          <button
            type="button"
            className="rounded border border-line-strong bg-surface px-3 py-1 font-medium hover:bg-accent-soft"
            onClick={() => void me.refetch()}
          >
            Try again
          </button>
        </FullPageMessage>
      </div>
    );
  }
  if (!me.data) {
    const state: SignInLocationState = {
      from: { pathname: location.pathname, search: location.search, hash: location.hash },
    };
    return <Navigate to="/sign-in" replace state={state} />;
  }
  return children;
}
