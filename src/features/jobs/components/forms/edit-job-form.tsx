import { type FormEvent } from 'react';
import { updateJobBodySchema, type Job } from '../../../../../shared/schemas/sites.ts';
import { requestFormErrors, zodFormErrors } from '../../../../lib/form-errors.ts';
import { useUpdateJob } from '../../api/update-job.ts';
import { describedBy, FormField, inputClass } from '../../../../components/form-field.tsx';
import { enterSubmits, FormFooter, useFormErrors } from './form-parts.tsx';

const fields = ['reference', 'visitDate', 'visitEndDate'] as const;
type Field = (typeof fields)[number];

/** A job's reference and visit dates. */
export function EditJobForm({ job, onSaved }: { job: Job; onSaved: (job: Job) => void }) {
  const updateJob = useUpdateJob();
  const { errors, setErrors, id, show, fieldError } = useFormErrors(fields);


  function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (updateJob.isPending) return;
    const data = new FormData(event.currentTarget);
    const text = (name: Field) => String(data.get(name) ?? '').trim();
    const next = { reference: text('reference'), visitDate: text('visitDate'), visitEndDate: text('visitEndDate') || null };
    const changes = Object.fromEntries(Object.entries(next).filter(([key, value]) => value !== job[key as Field]));
    setErrors(null);
    if (next.visitEndDate && next.visitEndDate < next.visitDate) return show({ fields: { visitEndDate: 'The last day of the visit cannot be before the first.' } });
    const parsed = updateJobBodySchema.safeParse({ version: job.version, changes });
    if (!parsed.success) return show(zodFormErrors(parsed.error, fields));
    updateJob.mutate({ jobId: job.id, body: parsed.data }, { onSuccess: onSaved, onError: (error) => show(requestFormErrors(error, fields, 'reference')) });
  }

  const control = (field: Field, hasHint = false) => ({ id: id(field), name: field, ...describedBy(id(field), fieldError(field), hasHint) });

  return (
    <form noValidate onSubmit={handleSubmit} onKeyDown={enterSubmits} className="space-y-3" aria-label={`Edit job ${job.reference}`}>
      <FormField id={id('reference')} label="Reference" error={fieldError('reference')}>
        <input {...control('reference')} defaultValue={job.reference} autoComplete="off" spellCheck={false} className={inputClass} />
      </FormField>
      <div className="grid gap-3 sm:grid-cols-2">
        <FormField id={id('visitDate')} label="First day of the visit" hint="YYYY-MM-DD" error={fieldError('visitDate')}>
          <input {...control('visitDate', true)} defaultValue={job.visitDate} autoComplete="off" className={inputClass} />
        </FormField>
        <FormField id={id('visitEndDate')} label="Last day, if more than one" hint="YYYY-MM-DD, or blank" error={fieldError('visitEndDate')}>
          <input {...control('visitEndDate', true)} defaultValue={job.visitEndDate ?? ''} autoComplete="off" className={inputClass} />
        </FormField>
      </div>
      <FormFooter pending={updateJob.isPending} label="Save the job" pendingLabel="Saving…" formError={errors?.form} />
    </form>
  );
}
