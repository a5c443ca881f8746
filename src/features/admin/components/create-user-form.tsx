import { FormField, describedBy, inputClass } from '../../../components/form-field.tsx';
import { useId, useRef, useState, type FormEvent } from 'react';
import type { CreateUserBody } from '../../../../shared/schemas/auth.ts';
import { roles, type Role } from '../../../../shared/schemas/common.ts';
import { useCreateUser } from '../api/create-user.ts';
import { fieldErrorsFrom, type FieldErrors } from '../field-errors.ts';

const fields = ['email', 'name', 'role', 'password'] as const;
type Field = (typeof fields)[number];

/** What each role may do, shown next to the choice. */
const roleDescriptions: Record<Role, string> = {
  tester: 'types readings and the job record, and signs for the work they did',
  reviewer: 'also accepts findings, locks and unlocks boards, approves, signs as reviewer, issues and sends',
  admin: 'also manages people and the company details',
};

/** Props that tie an input to its hint or error. */
/** Adds a person. The server checks everything; its messages appear at the fields they concern. */
export function CreateUserForm() {
  const createUser = useCreateUser();
  const [errors, setErrors] = useState<FieldErrors<Field> | null>(null);
  const [created, setCreated] = useState<string | null>(null);
  const formRef = useRef<HTMLFormElement>(null);
  const baseId = useId();
  const id = (field: Field) => `${baseId}-${field}`;

  function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (createUser.isPending) return;
    const data = new FormData(event.currentTarget);
    const body: CreateUserBody = {
      email: String(data.get('email') ?? ''),
      name: String(data.get('name') ?? ''),
      role: String(data.get('role') ?? 'tester') as Role,
      password: String(data.get('password') ?? ''),
    };
    setErrors(null);
    setCreated(null);
    createUser.mutate(body, {
      onSuccess: (user) => {
        formRef.current?.reset();
        setCreated(`${user.name} can now sign in as ${user.email} (${user.role}).`);
        document.getElementById(id('email'))?.focus();
      },
      onError: (error) => {
        const found = fieldErrorsFrom(error, fields, 'email');
        setErrors(found);
        const first = fields.find((f) => found.fields[f]);
        if (first) document.getElementById(id(first))?.focus();
      },
    });
  }

  const fieldError = (field: Field) => errors?.fields[field];

  return (
    <form
      ref={formRef}
      aria-labelledby={`${baseId}-heading`}
      noValidate
      onSubmit={handleSubmit}
      className="space-y-3 rounded border border-line bg-surface p-4"
    >
      <h2 id={`${baseId}-heading`} className="text-base font-semibold">
        Add a person
      </h2>
      <FormField id={id('email')} label="E-mail" error={fieldError('email')}>
        <input id={id('email')} name="email" type="email" autoComplete="off" spellCheck={false} className={inputClass} {...describedBy(id('email'), fieldError('email'), false)} />
      </FormField>
      <FormField id={id('name')} label="Name" error={fieldError('name')}>
        <input id={id('name')} name="name" type="text" autoComplete="off" className={inputClass} {...describedBy(id('name'), fieldError('name'), false)} />
      </FormField>
      <FormField id={id('role')} label="Role" error={fieldError('role')}>
        <select id={id('role')} name="role" defaultValue="tester" className={inputClass} {...describedBy(id('role'), fieldError('role'), false)}>
          {roles.map((role) => (
            <option key={role} value={role}>
              {role} — {roleDescriptions[role]}
            </option>
          ))}
        </select>
      </FormField>
      <FormField id={id('password')} label="Password" hint="At least 10 characters. Pass it on privately." error={fieldError('password')}>
        <input id={id('password')} name="password" type="password" autoComplete="new-password" className={inputClass} {...describedBy(id('password'), fieldError('password'), true)} />
      </FormField>
      <button
        type="submit"
        aria-disabled={createUser.isPending || undefined}
        className="rounded bg-accent px-3 py-1.5 font-medium text-white hover:bg-accent-hover aria-disabled:opacity-70"
      >
        {createUser.isPending ? 'Adding…' : 'Add person'}
      </button>
      <div role="alert" className="empty:hidden text-danger">
        {errors?.form}
      </div>
      <p role="status" className="empty:hidden text-ok">
        {created}
      </p>
    </form>
  );
}
