import { useState, type KeyboardEvent } from 'react';
import type { User } from '../../../../shared/schemas/auth.ts';
import { useUpdateUser } from '../api/update-user.ts';
import { fieldErrorsFrom } from '../field-errors.ts';

/**
 * A person's name as shown on history and signatures: edit it in place and press Enter (or "Save
 * name"); Esc puts back the saved name. Their history keeps who did what (it records the person,
 * not the name). The server's refusal shows beside the field.
 */
export function NameEditor({ user }: { user: User }) {
  const updateUser = useUpdateUser();
  const [name, setName] = useState(user.name);
  const [savedName, setSavedName] = useState(user.name);
  if (savedName !== user.name) {
    setSavedName(user.name);
    setName(user.name);
  }
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const changed = name.trim() !== user.name;

  function save() {
    if (!changed || updateUser.isPending) return;
    if (name.trim() === '') {
      setError('A name cannot be empty.');
      return;
    }
    setError(null);
    setDone(null);
    updateUser.mutate(
      { id: user.id, changes: { name: name.trim() } },
      {
        onSuccess: (updated) => setDone(`Saved as ${updated.name}.`),
        onError: (failure) => {
          const found = fieldErrorsFrom(failure, ['name'] as const);
          setError(found.fields.name ?? found.form ?? failure.message);
        },
      },
    );
  }

  const onKeyDown = (event: KeyboardEvent<HTMLInputElement>) => {
    if (event.key === 'Enter') {
      event.preventDefault();
      save();
    } else if (event.key === 'Escape' && changed) {
      event.preventDefault();
      setName(user.name);
      setError(null);
    }
  };

  return (
    <div className="flex flex-wrap items-center gap-2">
      <input
        aria-label={`Name of ${user.name}`}
        value={name}
        onChange={(event) => {
          setName(event.target.value);
          setError(null);
          setDone(null);
        }}
        onKeyDown={onKeyDown}
        aria-invalid={error ? true : undefined}
        className="w-44 rounded border border-line-strong bg-surface px-1.5 py-0.5 font-medium aria-invalid:border-danger"
      />
      {changed && (
        <button type="button" onClick={save} disabled={updateUser.isPending} className="rounded border border-line-strong px-2 py-0.5">
          Save name
        </button>
      )}
      {error && (
        <span role="alert" className="text-sm text-danger">
          {error}
        </span>
      )}
      {done && (
        <span role="status" className="text-sm text-ok">
          {done}
        </span>
      )}
    </div>
  );
}
