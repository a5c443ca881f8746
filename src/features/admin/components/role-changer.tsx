import { useState } from 'react';
import type { User } from '../../../../shared/schemas/auth.ts';
import { roles, type Role } from '../../../../shared/schemas/common.ts';
import { useUpdateUser } from '../api/update-user.ts';
import { fieldErrorsFrom } from '../field-errors.ts';

/**
 * A person's role: choose another and press "Change role". Choosing alone changes nothing, so
 * moving through the list with the arrow keys cannot demote anyone by accident. The server's
 * refusal (the last admin, one's own admin role) shows beside the choice.
 */
export function RoleChanger({ user }: { user: User }) {
  const updateUser = useUpdateUser();
  const [role, setRole] = useState<Role>(user.role);
  // When the role changes under us (this change saved, or another admin's seen on refetch), show it.
  const [savedRole, setSavedRole] = useState<Role>(user.role);
  if (savedRole !== user.role) {
    setSavedRole(user.role);
    setRole(user.role);
  }
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const changed = role !== user.role;

  function changeRole() {
    if (!changed || updateUser.isPending) return;
    setError(null);
    setDone(null);
    updateUser.mutate(
      { id: user.id, changes: { role } },
      {
        onSuccess: (updated) => setDone(`Now ${updated.role}.`),
        onError: (failure) => {
          const found = fieldErrorsFrom(failure, ['role'] as const);
          setError(found.fields.role ?? found.form ?? failure.message);
        },
      },
    );
  }

  return (
    <div className="flex flex-wrap items-center gap-2">
      <select
        aria-label={`Role of ${user.name}`}
        value={role}
        onChange={(event) => {
          setRole(event.target.value as Role);
          setError(null);
          setDone(null);
        }}
        aria-invalid={error ? true : undefined}
        className="rounded border border-line-strong bg-surface px-1.5 py-0.5 aria-invalid:border-danger"
      >
        {roles.map((r) => (
          <option key={r} value={r}>
            {r}
          </option>
        ))}
      </select>
      {changed && (
        <>
          <button
            type="button"
            onClick={changeRole}
            aria-disabled={updateUser.isPending || undefined}
            className="rounded border border-accent px-2 py-0.5 font-medium text-accent hover:bg-accent-soft aria-disabled:opacity-70"
          >
            {updateUser.isPending ? 'Changing…' : 'Change role'}
          </button>
          <button
            type="button"
            onClick={() => {
              setRole(user.role);
              setError(null);
            }}
            className="rounded px-2 py-0.5 text-muted hover:bg-paper"
          >
            Keep {user.role}
          </button>
        </>
      )}
      {error && (
        <span role="alert" className="text-danger">
          {error}
        </span>
      )}
      {done && !changed && (
        <span role="status" className="text-ok">
          {done}
        </span>
      )}
    </div>
  );
}
