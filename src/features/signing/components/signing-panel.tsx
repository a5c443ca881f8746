import { useId, useRef, useState, type FormEvent } from 'react';
import type { Role } from '../../../../shared/schemas/common.ts';
import {
  maxSignatureBytes,
  signingRefusal,
  signingRoleLabels,
  type JobSignatures,
  type Signature,
  type SigningRole,
} from '../../../../shared/schemas/signatures.ts';
import { ApiError } from '../../../lib/api-client.ts';
import { useSignatures } from '../api/get-signatures.ts';
import { useSignJob } from '../api/sign-job.ts';
import { clearPad, padToPng, SignaturePad } from './signature-pad.tsx';

const inputClass =
  'block w-full rounded border border-line-strong bg-surface px-2 py-1 aria-invalid:border-danger aria-invalid:bg-danger-soft';
const buttonClass = 'rounded bg-accent px-3 py-1.5 font-medium text-white hover:bg-accent-hover aria-disabled:opacity-70';
const quietButtonClass = 'rounded border border-line-strong px-2 py-0.5 font-medium hover:bg-accent-soft';

const when = (iso: string) => new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });

export interface SigningPerson {
  role: Role;
  name: string;
}

/**
 * Signing on the job screen: the declaration's people (an EIC's designer, constructor and
 * inspector; the inspector of an EICR) and the reviewer sign with a typed name and a signature
 * drawn in the box or chosen as an image file. Shows the signatures in use and keeps the earlier
 * ones listed. Who may sign what is said before anyone tries (the server decides).
 */
export function SigningPanel({ jobId, person }: { jobId: number; person: SigningPerson }) {
  const signatures = useSignatures(jobId);
  const headingId = useId();
  return (
    <section aria-labelledby={headingId} className="space-y-3 rounded border border-line bg-surface p-4">
      <h2 id={headingId} className="text-base font-semibold">
        Signatures
      </h2>
      {signatures.isPending && <p className="text-muted">Loading the signatures…</p>}
      {signatures.isError && (
        <div role="alert" className="space-y-2 text-danger">
          <p>The signatures could not be loaded: {signatures.error.message}</p>
          <button type="button" className="rounded border border-danger px-2 py-0.5 font-medium" onClick={() => void signatures.refetch()}>
            Try again
          </button>
        </div>
      )}
      {signatures.isSuccess && (
        <>
          <CurrentSignatures data={signatures.data} />
          <SignForm jobId={jobId} person={person} data={signatures.data} />
        </>
      )}
    </section>
  );
}

function CurrentSignatures({ data }: { data: JobSignatures }) {
  const earlier = data.signatures.filter((s) => !s.current);
  const reopened = data.reopened;
  return (
    <div className="space-y-2">
      {reopened && (
        <p className="rounded border border-line bg-paper px-2 py-1 text-sm">
          {reopened.by.name} reopened revision {reopened.revision} on {when(reopened.at)}
          {reopened.reason ? <> (“{reopened.reason}”)</> : null}. Everyone signs again for revision {data.revision}: the document may
          change before it is issued again, and a signature stays with the revision it was given for. Revision {reopened.revision}’s
          signatures are kept below.
        </p>
      )}
      <ul className="grid gap-2 sm:grid-cols-2" aria-label="Signatures in use">
        {data.roles.map((role) => {
          const signature = data.signatures.find((s) => s.role === role && s.current);
          return (
            <li key={role} className="space-y-1 rounded border border-line p-2">
              <p className="text-xs font-medium text-muted">{signingRoleLabels[role].replace(/^./, (c) => c.toUpperCase())}</p>
              {signature ? <SignatureCard signature={signature} /> : <p className="text-muted">Not signed yet.</p>}
            </li>
          );
        })}
      </ul>
      {earlier.length > 0 && (
        <details>
          <summary className="cursor-pointer text-muted">Earlier signatures, replaced but kept ({earlier.length})</summary>
          <ul className="mt-1 space-y-1">
            {earlier.map((s) => (
              <li key={s.id} className="text-sm">
                {signingRoleLabels[s.role]}: {s.name}, {when(s.signedAt)} (by {s.signedBy.name})
                {s.revision < data.revision && `, given for revision ${s.revision}`}
              </li>
            ))}
          </ul>
        </details>
      )}
    </div>
  );
}

function SignatureCard({ signature }: { signature: Signature }) {
  return (
    <div>
      <img src={`/api/files/${signature.fileId}`} alt={`Signature of ${signature.name}`} className="h-16 max-w-full object-contain" />
      <p className="font-medium">{signature.name}</p>
      <p className="text-xs text-muted">
        Signed {when(signature.signedAt)}
        {signature.signedBy.name !== signature.name && ` by ${signature.signedBy.name}'s account`}
      </p>
    </div>
  );
}

type Method = 'draw' | 'file';
interface FormErrors {
  name?: string;
  image?: string;
  form?: string;
}

function SignForm({ jobId, person, data }: { jobId: number; person: SigningPerson; data: JobSignatures }) {
  const sign = useSignJob();
  const job = { kind: data.jobKind, state: data.jobState };
  const firstAllowed = data.roles.find((r) => signingRefusal(person.role, r, job) === null) ?? data.roles[0]!;
  const [role, setRole] = useState<SigningRole>(person.role === 'tester' || data.jobState === 'entering' ? firstAllowed : 'reviewer');
  const [method, setMethod] = useState<Method>('draw');
  const [hasInk, setHasInk] = useState(false);
  const [errors, setErrors] = useState<FormErrors>({});
  const [signed, setSigned] = useState<string | null>(null);
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const fileRef = useRef<HTMLInputElement>(null);
  const formRef = useRef<HTMLFormElement>(null);
  const baseId = useId();
  const ids = { role: `${baseId}-role`, name: `${baseId}-name`, pad: `${baseId}-pad`, file: `${baseId}-file`, image: `${baseId}-image` };

  const refusal = signingRefusal(person.role, data.roles.includes(role) ? role : firstAllowed, job);
  if (data.jobState === 'issued') {
    return <p className="text-muted">{refusal?.message}</p>;
  }

  const focusImage = () => (method === 'draw' ? canvasRef.current : fileRef.current)?.focus();

  async function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (sign.isPending) return;
    setErrors({});
    setSigned(null);
    if (refusal) {
      setErrors({ form: refusal.message });
      return;
    }
    const name = String(new FormData(event.currentTarget).get('name') ?? '').trim();
    if (!name) {
      setErrors({ name: 'Type your name as it should appear beside the signature.' });
      document.getElementById(ids.name)?.focus();
      return;
    }
    let image: Blob | null = null;
    let filename = 'signature.png';
    if (method === 'draw') {
      if (!hasInk || !canvasRef.current) {
        setErrors({ image: 'Sign in the box first (mouse, pen or finger), or choose an image file instead.' });
        focusImage();
        return;
      }
      image = await padToPng(canvasRef.current);
      if (!image) {
        setErrors({ image: 'This browser could not turn the drawing into an image; choose an image file instead.' });
        return;
      }
    } else {
      const file = fileRef.current?.files?.[0];
      if (!file) {
        setErrors({ image: 'Choose a PNG or JPEG image of the signature.' });
        focusImage();
        return;
      }
      if (file.size > maxSignatureBytes) {
        setErrors({ image: `A signature image may be at most ${maxSignatureBytes / 1024} kB; ${file.name} is ${Math.ceil(file.size / 1024)} kB.` });
        focusImage();
        return;
      }
      image = file;
      filename = file.name;
    }
    sign.mutate(
      { jobId, body: { role, name }, image, filename },
      {
        onSuccess: (signature) => {
          clearPad(canvasRef.current);
          setHasInk(false);
          if (fileRef.current) fileRef.current.value = '';
          setSigned(`Signed as ${signingRoleLabels[signature.role]} by ${signature.name}.`);
        },
        onError: (error) => {
          const issue = error instanceof ApiError ? error.issues.find((i) => i.path === 'name') : undefined;
          if (issue) {
            setErrors({ name: issue.message });
            document.getElementById(ids.name)?.focus();
          } else if (error instanceof ApiError && (error.status === 413 || error.status === 415)) {
            setErrors({ image: error.message });
            focusImage();
          } else {
            setErrors({ form: error.message });
          }
        },
      },
    );
  }

  return (
    <form ref={formRef} noValidate onSubmit={(e) => void handleSubmit(e)} aria-label="Sign this job" className="space-y-3 border-t border-line pt-3">
      <div className="grid gap-3 sm:grid-cols-2">
        <div className="space-y-1">
          <label htmlFor={ids.role} className="block font-medium">
            Sign as
          </label>
          <select id={ids.role} value={role} onChange={(e) => setRole(e.target.value as SigningRole)} className={inputClass}>
            {data.roles.map((r) => (
              <option key={r} value={r}>
                {signingRoleLabels[r]}
              </option>
            ))}
          </select>
        </div>
        <div className="space-y-1">
          <label htmlFor={ids.name} className="block font-medium">
            Name
          </label>
          <input
            id={ids.name}
            name="name"
            type="text"
            defaultValue={person.name}
            autoComplete="name"
            className={inputClass}
            aria-invalid={errors.name ? true : undefined}
            aria-describedby={errors.name ? `${ids.name}-error` : undefined}
          />
          {errors.name && (
            <p id={`${ids.name}-error`} className="text-danger">
              {errors.name}
            </p>
          )}
        </div>
      </div>

      <fieldset className="space-y-2">
        <legend className="font-medium">Signature</legend>
        <div className="flex flex-wrap gap-4">
          <label className="flex items-center gap-1.5">
            <input type="radio" name="method" value="draw" checked={method === 'draw'} onChange={() => setMethod('draw')} />
            Draw it here
          </label>
          <label className="flex items-center gap-1.5">
            <input type="radio" name="method" value="file" checked={method === 'file'} onChange={() => setMethod('file')} />
            Choose an image file
          </label>
        </div>
        {method === 'draw' ? (
          <div className="space-y-1">
            <SignaturePad
              canvasRef={canvasRef}
              label="Signature box: sign with a mouse, pen or finger"
              describedBy={errors.image ? ids.image : `${ids.pad}-hint`}
              onInkChange={setHasInk}
            />
            <div className="flex items-center gap-2">
              <button
                type="button"
                className={quietButtonClass}
                onClick={() => {
                  clearPad(canvasRef.current);
                  setHasInk(false);
                  canvasRef.current?.focus();
                }}
              >
                Clear
              </button>
              <p id={`${ids.pad}-hint`} className="text-xs text-muted">
                Delete or Backspace in the box clears it too.
              </p>
            </div>
          </div>
        ) : (
          <div className="space-y-1">
            <label htmlFor={ids.file} className="block">
              Signature image (PNG or JPEG, at most {maxSignatureBytes / 1024} kB)
            </label>
            <input
              ref={fileRef}
              id={ids.file}
              type="file"
              accept="image/png,image/jpeg"
              className="block w-full text-sm"
              aria-invalid={errors.image ? true : undefined}
              aria-describedby={errors.image ? ids.image : undefined}
            />
          </div>
        )}
        {errors.image && (
          <p id={ids.image} className="text-danger">
            {errors.image}
          </p>
        )}
      </fieldset>

      {refusal && <p className="text-muted">{refusal.message}</p>}
      <button type="submit" aria-disabled={sign.isPending || refusal !== null || undefined} className={buttonClass}>
        {sign.isPending ? 'Signing…' : `Sign as ${role}`}
      </button>
      <div role="alert" className="empty:hidden text-danger">
        {errors.form}
      </div>
      <p role="status" className="empty:hidden text-ok">
        {signed}
      </p>
    </form>
  );
}
