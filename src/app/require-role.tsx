import type { ReactNode } from 'react';
import type { Role } from '../../shared/schemas/common.ts';
import { useMe } from '../features/auth/api/get-me.ts';
import { FullPageMessage } from './full-page-message.tsx';

/**
 * Shows its children only to people with one of the roles; others get a plain sentence saying
 * who may use the page. The server refuses the same people, so this is courtesy, not the lock.
 * Sits inside RequireAuth, so `me` is already known.
 */
export function RequireRole({ roles, refusal, children }: { roles: readonly Role[]; refusal: string; children: ReactNode }) {
  const me = useMe();
  if (me.data && roles.includes(me.data.role)) return children;
  return (
    <FullPageMessage title="Not available to you">
      <p>{refusal}</p>
    </FullPageMessage>
  );
}
