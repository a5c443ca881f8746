import { FormField, describedBy, inputClass } from '../../../components/form-field.tsx';
import { useId, useRef, useState, type FormEvent } from 'react';
import { maxLogoBytes } from '../../../../shared/schemas/company-logo.ts';
import type { Company, CompanyFields } from '../../../../shared/schemas/company.ts';
import { useRemoveLogo, useUploadLogo } from '../api/company-logo.ts';
import { useCompany } from '../api/get-company.ts';
import { useUpdateCompany } from '../api/update-company.ts';
import { fieldErrorsFrom, type FieldErrors } from '../field-errors.ts';

const fields = ['name', 'address', 'phone', 'email', 'registration', 'referencePattern'] as const;
type Field = (typeof fields)[number];

const buttonClass = 'rounded bg-accent px-3 py-1.5 font-medium text-white hover:bg-accent-hover aria-disabled:opacity-70';
const quietButtonClass = 'rounded border border-line-strong px-3 py-1.5 font-medium hover:bg-accent-soft aria-disabled:opacity-70';

/** Admins only: the company's details and logo, printed on every issued certificate and report. */
export function CompanyPage() {
  const company = useCompany();
  return (
    <div className="mx-auto grid w-full max-w-5xl items-start gap-4 p-4 lg:grid-cols-[1fr_20rem]">
      <div className="min-w-0 space-y-2">
        <h1 className="text-lg font-semibold">Company details</h1>
        <p className="text-muted">Printed on every certificate and report Boardwalk issues, and signed at the foot of every e-mail to a client.</p>
        {company.isPending && <p className="text-muted">Loading the company's details…</p>}
        {company.isError && (
          <div role="alert" className="space-y-2 rounded border border-danger bg-danger-soft px-3 py-2 text-danger">
            <p>The company's details could not be loaded: {company.error.message}</p>
            <button type="button" className="rounded border border-danger bg-surface px-2 py-0.5 font-medium" onClick={() => void company.refetch()}>
              Try again
            </button>
          </div>
        )}
        {/* Mounted once the details are loaded: its fields start from them and then hold what is typed. */}
        {company.isSuccess && <CompanyForm company={company.data} />}
      </div>
      {company.isSuccess && <LogoPanel company={company.data} />}
    </div>
  );
}

function CompanyForm({ company }: { company: Company }) {
  const update = useUpdateCompany();
  const [errors, setErrors] = useState<FieldErrors<Field> | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const baseId = useId();
  const id = (field: Field) => `${baseId}-${field}`;

  function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (update.isPending) return;
    const data = new FormData(event.currentTarget);
    const body = Object.fromEntries(fields.map((f) => [f, String(data.get(f) ?? '')])) as CompanyFields;
    setErrors(null);
    setSaved(null);
    update.mutate(body, {
      onSuccess: () => setSaved('Saved. Documents issued from now on carry these details.'),
      onError: (error) => {
        const found = fieldErrorsFrom(error, fields);
        setErrors(found);
        const first = fields.find((f) => found.fields[f]);
        if (first) document.getElementById(id(first))?.focus();
      },
    });
  }

  const fieldError = (field: Field) => errors?.fields[field];
  const text = (field: Exclude<Field, 'address'>, label: string, options: { hint?: string; type?: string; autoComplete?: string } = {}) => (
    <FormField id={id(field)} label={label} hint={options.hint} error={fieldError(field)}>
      <input
        id={id(field)}
        name={field}
        type={options.type ?? 'text'}
        defaultValue={company[field]}
        autoComplete={options.autoComplete ?? 'off'}
        className={inputClass}
        {...describedBy(id(field), fieldError(field), Boolean(options.hint))}
      />
    </FormField>
  );

  return (
    <form aria-label="Company details" noValidate onSubmit={handleSubmit} className="space-y-3 rounded border border-line bg-surface p-4">
      {text('name', 'Company name', { autoComplete: 'organization' })}
      <FormField id={id('address')} label="Address" error={fieldError('address')}>
        <textarea
          id={id('address')}
          name="address"
          rows={3}
          defaultValue={company.address}
          className={inputClass}
          onKeyDown={(e) => {
            // Enter saves, as in every other field; Shift+Enter starts a new line of the address.
            if (e.key === 'Enter' && !e.shiftKey && !e.nativeEvent.isComposing) {
              e.preventDefault();
              e.currentTarget.form?.requestSubmit();
            }
          }}
          {...describedBy(id('address'), fieldError('address'), true)}
        />
        {!fieldError('address') && (
          <p id={`${id('address')}-hint`} className="text-xs text-muted">
            Shift+Enter starts a new line.
          </p>
        )}
      </FormField>
      <div className="grid gap-3 sm:grid-cols-2">
        {text('phone', 'Telephone', { type: 'tel' })}
        {text('email', 'E-mail', { type: 'email', hint: 'Clients reply to this address.' })}
      </div>
      {text('registration', 'Registration', { hint: 'A scheme or trade body the company is registered with, and its number, if any.' })}
      {text('referencePattern', 'Job references', {
        hint: 'How new job references are made: {kind} is EIC or EICR, {yyyy} or {yy} the year, {mm} the month, {seq:4} the next number of the year with 4 digits.',
      })}
      <button type="submit" aria-disabled={update.isPending || undefined} className={buttonClass}>
        {update.isPending ? 'Saving…' : 'Save details'}
      </button>
      <div role="alert" className="empty:hidden text-danger">
        {errors?.form}
      </div>
      <p role="status" className="empty:hidden text-ok">
        {saved}
      </p>
    </form>
  );
}

function LogoPanel({ company }: { company: Company }) {
  const upload = useUploadLogo();
  const remove = useRemoveLogo();
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const inputRef = useRef<HTMLInputElement>(null);
  const formRef = useRef<HTMLFormElement>(null);
  const inputId = useId();

  function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (upload.isPending) return;
    const file = inputRef.current?.files?.[0];
    setError(null);
    setDone(null);
    if (!file) {
      setError('Choose a PNG or JPEG file first.');
      inputRef.current?.focus();
      return;
    }
    if (file.size > maxLogoBytes) {
      // Said here at once; the server refuses it too.
      setError(`The logo may be at most 1 MB; ${file.name} is ${(file.size / (1024 * 1024)).toFixed(1)} MB.`);
      inputRef.current?.focus();
      return;
    }
    upload.mutate(file, {
      onSuccess: () => {
        formRef.current?.reset();
        setDone('Logo saved.');
      },
      onError: (e) => {
        setError(e.message);
        inputRef.current?.focus();
      },
    });
  }

  return (
    <section aria-labelledby={`${inputId}-heading`} className="space-y-3 rounded border border-line bg-surface p-4">
      <h2 id={`${inputId}-heading`} className="text-base font-semibold">
        Logo
      </h2>
      {company.logoFileId === null ? (
        <p className="text-muted">No logo yet: documents show the company's name alone.</p>
      ) : (
        <img
          src={`/api/files/${company.logoFileId}`}
          alt={`Logo of ${company.name}`}
          className="max-h-32 max-w-full rounded border border-line bg-paper object-contain p-2"
        />
      )}
      <form ref={formRef} noValidate onSubmit={handleSubmit} className="space-y-2" aria-label="Upload a logo">
        <label htmlFor={inputId} className="block font-medium">
          {company.logoFileId === null ? 'Logo file' : 'New logo file'}
        </label>
        <input
          ref={inputRef}
          id={inputId}
          name="logo"
          type="file"
          accept="image/png,image/jpeg"
          className="block w-full text-sm"
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${inputId}-error` : `${inputId}-hint`}
          onKeyDown={(e) => {
            if (e.key === 'Enter' && inputRef.current?.files?.length) {
              e.preventDefault();
              formRef.current?.requestSubmit();
            }
          }}
        />
        {error ? (
          <p id={`${inputId}-error`} className="text-danger">
            {error}
          </p>
        ) : (
          <p id={`${inputId}-hint`} className="text-xs text-muted">
            PNG or JPEG, at most 1 MB. The file's content is checked, not its name.
          </p>
        )}
        <div className="flex flex-wrap gap-2">
          <button type="submit" aria-disabled={upload.isPending || undefined} className={buttonClass}>
            {upload.isPending ? 'Uploading…' : 'Upload logo'}
          </button>
          {company.logoFileId !== null && (
            <button
              type="button"
              aria-disabled={remove.isPending || undefined}
              className={quietButtonClass}
              onClick={() => {
                if (remove.isPending) return;
                setError(null);
                setDone(null);
                remove.mutate(undefined, { onSuccess: () => setDone('Logo removed.'), onError: (e) => setError(e.message) });
              }}
            >
              Remove logo
            </button>
          )}
        </div>
        <p role="status" className="empty:hidden text-ok">
          {done}
        </p>
      </form>
    </section>
  );
}
