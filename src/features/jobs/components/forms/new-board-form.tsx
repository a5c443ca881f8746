import { useState, type FormEvent } from 'react';
import { boardLayouts, createBoardBodySchema } from '../../../../../shared/schemas/sites.ts';
import { numberOrText, requestFormErrors, zodFormErrors } from '../../../../lib/form-errors.ts';
import { useCreateBoard } from '../../api/create-board.ts';
import type { SiteWithJobs } from '../../api/get-jobs.ts';
import { describedBy, FormField, inputClass } from '../../../../components/form-field.tsx';
import { enterSubmits, FormFooter, useFormErrors } from './form-parts.tsx';

const fields = ['jobId', 'reference', 'location', 'suppliedFrom', 'copyFromBoardId', 'layout', 'ways'] as const;
type Field = (typeof fields)[number];

const layoutWords: Record<(typeof boardLayouts)[number], string> = {
  'single-phase': 'Single-phase: ways numbered 1, 2, 3…',
  'three-phase': 'Three-phase: each way numbered per phase (1L1, 1L2, 1L3…)',
};

export interface NewBoardFormProps {
  tree: readonly SiteWithJobs[];
  /** The job chosen when the form opens (on a job's own screen, the only one offered). */
  jobId?: number;
  /** Offer only this job (the job screen). */
  fixedJob?: boolean;
  onCreated: (board: { id: number; reference: string }) => void;
}

/**
 * A new board on a job: empty with N ways of a layout, or a copy of another board's circuit
 * details (its readings are not copied).
 */
export function NewBoardForm({ tree, jobId: initialJobId, fixedJob = false, onCreated }: NewBoardFormProps) {
  const createBoard = useCreateBoard();
  const { errors, setErrors, id, show, fieldError } = useFormErrors(fields);
  const allJobs = tree.flatMap((entry) => entry.jobs.map((j) => ({ ...j, site: entry.site })));
  const jobs = fixedJob ? allJobs.filter((entry) => entry.job.id === initialJobId) : allJobs;
  const [jobId, setJobId] = useState<number | null>(initialJobId ?? jobs[0]?.job.id ?? null);
  const [copyFrom, setCopyFrom] = useState('');
  const boards = allJobs.flatMap((entry) => entry.boards);
  const copied = boards.find((board) => String(board.id) === copyFrom);


  function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (createBoard.isPending) return;
    const data = new FormData(event.currentTarget);
    const text = (name: Field) => String(data.get(name) ?? '');
    setErrors(null);
    if (jobId === null) return show({ fields: { jobId: 'Choose the job the board belongs to.' } });
    const body = copied
      ? { reference: text('reference'), location: text('location'), suppliedFrom: text('suppliedFrom'), layout: copied.phases === 3 ? 'three-phase' : 'single-phase', copyFromBoardId: copied.id }
      : { reference: text('reference'), location: text('location'), suppliedFrom: text('suppliedFrom'), layout: text('layout'), ways: numberOrText(text('ways')) ?? undefined, copyFromBoardId: null };
    const parsed = createBoardBodySchema.safeParse(body);
    if (!parsed.success) return show(zodFormErrors(parsed.error, fields));
    createBoard.mutate({ jobId, body: parsed.data }, { onSuccess: onCreated, onError: (error) => show(requestFormErrors(error, fields)) });
  }

  const control = (field: Field, hasHint = false) => ({ id: id(field), name: field, ...describedBy(id(field), fieldError(field), hasHint) });

  return (
    <form noValidate onSubmit={handleSubmit} onKeyDown={enterSubmits} className="space-y-3" aria-label="New board">
      <FormField id={id('jobId')} label="Job" error={fieldError('jobId')}>
        <select {...control('jobId')} value={jobId ?? ''} onChange={(event) => setJobId(event.target.value ? Number(event.target.value) : null)} className={inputClass}>
          {jobs.length === 0 && <option value="">No job yet: start one first</option>}
          {jobs.map(({ job, site }) => (
            <option key={job.id} value={job.id}>
              {job.kind} {job.reference} — {site.client}
            </option>
          ))}
        </select>
      </FormField>
      <FormField id={id('reference')} label="Board reference" hint="As the client knows it, e.g. DB1, Garage CU" error={fieldError('reference')}>
        <input {...control('reference', true)} autoFocus={jobId !== null} autoComplete="off" className={inputClass} />
      </FormField>
      <div className="grid gap-3 sm:grid-cols-2">
        <FormField id={id('location')} label="Location" error={fieldError('location')}>
          <input {...control('location')} autoComplete="off" className={inputClass} />
        </FormField>
        <FormField id={id('suppliedFrom')} label="Supplied from" hint="e.g. the origin, or DB1 way 4" error={fieldError('suppliedFrom')}>
          <input {...control('suppliedFrom', true)} autoComplete="off" className={inputClass} />
        </FormField>
      </div>
      <FormField id={id('copyFromBoardId')} label="Circuit details" error={fieldError('copyFromBoardId')}>
        <select {...control('copyFromBoardId')} value={copyFrom} onChange={(event) => setCopyFrom(event.target.value)} className={inputClass}>
          <option value="">Start empty, with the ways below</option>
          {boards.map((board) => (
            <option key={board.id} value={board.id}>
              copy the circuit details of board {board.reference} ({board.job.kind} {board.job.reference}, {board.site.client}, {board.circuitCount} circuits)
            </option>
          ))}
        </select>
      </FormField>
      {!copied && (
        <div className="grid gap-3 sm:grid-cols-[2fr_1fr]">
          <FormField id={id('layout')} label="Layout" error={fieldError('layout')}>
            <select {...control('layout')} defaultValue="single-phase" className={inputClass}>
              {boardLayouts.map((layout) => (
                <option key={layout} value={layout}>
                  {layoutWords[layout]}
                </option>
              ))}
            </select>
          </FormField>
          <FormField id={id('ways')} label="Number of ways" error={fieldError('ways')}>
            <input {...control('ways')} inputMode="numeric" autoComplete="off" className={inputClass} />
          </FormField>
        </div>
      )}
      {copied && <p className="text-muted">The new board takes board {copied.reference}’s layout and circuits; its readings start empty.</p>}
      <FormFooter pending={createBoard.isPending} label="Add the board" pendingLabel="Adding…" formError={errors?.form} />
    </form>
  );
}
