import { useState, type FormEvent } from 'react';
import { createJobBodySchema, jobKinds, type Job } from '../../../../../shared/schemas/sites.ts';
import { requestFormErrors, zodFormErrors } from '../../../../lib/form-errors.ts';
import { useCreateJob } from '../../api/create-job.ts';
import type { SiteWithJobs } from '../../api/get-jobs.ts';
import { describedBy, FormField, inputClass } from '../../../../components/form-field.tsx';
import { enterSubmits, FormFooter, todayText, useFormErrors } from './form-parts.tsx';

const fields = ['siteId', 'kind', 'reference', 'visitDate', 'visitEndDate', 'startFromJobId'] as const;
type Field = (typeof fields)[number];

const kindWords: Record<Job['kind'], string> = {
  EIC: 'EIC — certificate for new work',
  EICR: 'EICR — condition report on an existing installation',
};

export interface NewJobFormProps {
  tree: readonly SiteWithJobs[];
  /** The site chosen when the form opens. */
  siteId?: number;
  onCreated: (job: Job) => void;
}

/**
 * A new job on a site. The reference may be left blank: the app makes one from the company's
 * pattern and shows it once the job exists. An EICR on a site with an earlier job may start from
 * that job: its boards and circuit details are copied, readings left empty.
 */
export function NewJobForm({ tree, siteId: initialSiteId, onCreated }: NewJobFormProps) {
  const createJob = useCreateJob();
  const { errors, setErrors, id, show, fieldError } = useFormErrors(fields);
  const [siteId, setSiteId] = useState<number | null>(initialSiteId ?? tree[0]?.site.id ?? null);
  const [kind, setKind] = useState<Job['kind']>('EICR');
  const earlierJobs = tree.find((entry) => entry.site.id === siteId)?.jobs.map((entry) => entry.job) ?? [];


  function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (createJob.isPending) return;
    const data = new FormData(event.currentTarget);
    const text = (name: Field) => String(data.get(name) ?? '').trim();
    const startFrom = text('startFromJobId');
    const body = {
      siteId: siteId ?? undefined,
      kind,
      reference: text('reference') || undefined,
      visitDate: text('visitDate'),
      visitEndDate: text('visitEndDate') || null,
      startFromJobId: kind === 'EICR' && startFrom ? Number(startFrom) : null,
    };
    setErrors(null);
    const parsed = createJobBodySchema.safeParse(body);
    if (!parsed.success) return show(zodFormErrors(parsed.error, fields));
    createJob.mutate(parsed.data, { onSuccess: onCreated, onError: (error) => show(requestFormErrors(error, fields, 'reference')) });
  }

  const control = (field: Field, hasHint = false) => ({ id: id(field), name: field, ...describedBy(id(field), fieldError(field), hasHint) });

  return (
    <form noValidate onSubmit={handleSubmit} onKeyDown={enterSubmits} className="space-y-3" aria-label="New job">
      <FormField id={id('siteId')} label="Site" error={fieldError('siteId')}>
        <select {...control('siteId')} value={siteId ?? ''} onChange={(event) => setSiteId(event.target.value ? Number(event.target.value) : null)} className={inputClass}>
          {tree.length === 0 && <option value="">No site yet: add one first</option>}
          {tree.map(({ site }) => (
            <option key={site.id} value={site.id}>
              {site.client} — {site.address}
            </option>
          ))}
        </select>
      </FormField>
      <FormField id={id('kind')} label="Kind of job" error={fieldError('kind')}>
        <select {...control('kind')} autoFocus value={kind} onChange={(event) => setKind(event.target.value as Job['kind'])} className={inputClass}>
          {jobKinds.map((k) => (
            <option key={k} value={k}>
              {kindWords[k]}
            </option>
          ))}
        </select>
      </FormField>
      {kind === 'EICR' && earlierJobs.length > 0 && (
        <FormField id={id('startFromJobId')} label="Start from" hint="Copies the boards and their circuit details; readings start empty." error={fieldError('startFromJobId')}>
          <select {...control('startFromJobId', true)} defaultValue="" className={inputClass}>
            <option value="">Nothing: start with no boards</option>
            {earlierJobs.map((job) => (
              <option key={job.id} value={job.id}>
                start from {job.kind} {job.reference} of {job.visitDate}
              </option>
            ))}
          </select>
        </FormField>
      )}
      <FormField id={id('reference')} label="Reference" hint="Leave blank and the app makes one from the company’s pattern." error={fieldError('reference')}>
        <input {...control('reference', true)} autoComplete="off" spellCheck={false} className={inputClass} />
      </FormField>
      <div className="grid gap-3 sm:grid-cols-2">
        <FormField id={id('visitDate')} label="First day of the visit" hint="YYYY-MM-DD" error={fieldError('visitDate')}>
          <input {...control('visitDate', true)} defaultValue={todayText()} autoComplete="off" placeholder="YYYY-MM-DD" className={inputClass} />
        </FormField>
        <FormField id={id('visitEndDate')} label="Last day, if more than one" hint="YYYY-MM-DD, or blank" error={fieldError('visitEndDate')}>
          <input {...control('visitEndDate', true)} autoComplete="off" placeholder="YYYY-MM-DD" className={inputClass} />
        </FormField>
      </div>
      <FormFooter pending={createJob.isPending} label="Start the job" pendingLabel="Starting…" formError={errors?.form} />
    </form>
  );
}
