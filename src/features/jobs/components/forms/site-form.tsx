import { type FormEvent } from 'react';
import {
  createSiteBodySchema,
  earthingArrangements,
  siteFieldsSchema,
  updateSiteBodySchema,
  type Site,
  type SiteFields,
} from '../../../../../shared/schemas/sites.ts';
import { numberOrText, requestFormErrors, zodFormErrors } from '../../../../lib/form-errors.ts';
import { useCreateSite } from '../../api/create-site.ts';
import { useUpdateSite } from '../../api/update-site.ts';
import { describedBy, FormField, inputClass } from '../../../../components/form-field.tsx';
import { enterSubmits, FormFooter, useFormErrors } from './form-parts.tsx';

const fields = ['client', 'address', 'description', 'contactName', 'contactEmail', 'earthing', 'nominalVoltageV', 'zeOhm', 'pfcKa'] as const;
type Field = (typeof fields)[number];

const earthingWords: Record<(typeof earthingArrangements)[number], string> = {
  'TN-S': 'TN-S — earth from the supplier’s cable sheath or separate conductor',
  'TN-C-S': 'TN-C-S — combined neutral and earth in the supply (PME)',
  TT: 'TT — the installation’s own earth electrode',
};

const numberText = (value: number | null | undefined) => (value === null || value === undefined ? '' : String(value));

/** The form's values as the site's fields (numbers read from text; bad text left for zod to name). */
function readForm(form: HTMLFormElement): Record<Field, unknown> {
  const data = new FormData(form);
  const text = (name: Field) => String(data.get(name) ?? '');
  return {
    client: text('client'),
    address: text('address'),
    description: text('description'),
    contactName: text('contactName'),
    contactEmail: text('contactEmail').trim(),
    earthing: text('earthing'),
    nominalVoltageV: numberOrText(text('nominalVoltageV')),
    zeOhm: numberOrText(text('zeOhm')),
    pfcKa: numberOrText(text('pfcKa')),
  };
}

export interface SiteFormProps {
  /** The site to edit; omitted for a new site. */
  site?: Site;
  /** After saving: the site as it now stands. */
  onSaved: (site: Site) => void;
}

/**
 * A new site, or changes to one. Client and address are required; the rest can follow. Checked in
 * the browser with the same zod schemas as the server; the server's own refusals show at the
 * field they concern.
 */
export function SiteForm({ site, onSaved }: SiteFormProps) {
  const createSite = useCreateSite();
  const updateSite = useUpdateSite();
  const pending = createSite.isPending || updateSite.isPending;
  const { errors, setErrors, id, show, fieldError } = useFormErrors(fields);


  function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (pending) return;
    const values = readForm(event.currentTarget);
    setErrors(null);
    if (!site) {
      // A new site: leave out blank optional numbers so the server's defaults apply (230 V).
      const body = Object.fromEntries(Object.entries(values).filter(([key, value]) => !(key === 'nominalVoltageV' && value === null)));
      const parsed = createSiteBodySchema.safeParse(body);
      if (!parsed.success) return show(zodFormErrors(parsed.error, fields));
      createSite.mutate(parsed.data, { onSuccess: onSaved, onError: (error) => show(requestFormErrors(error, fields)) });
      return;
    }
    const checked = siteFieldsSchema.safeParse(values);
    if (!checked.success) return show(zodFormErrors(checked.error, fields));
    const changes: Partial<SiteFields> = {};
    for (const field of fields) {
      if (checked.data[field] !== site[field]) (changes as Record<string, unknown>)[field] = checked.data[field];
    }
    const parsed = updateSiteBodySchema.safeParse({ version: site.version, changes });
    if (!parsed.success) return show(zodFormErrors(parsed.error, fields));
    updateSite.mutate({ siteId: site.id, body: parsed.data }, { onSuccess: onSaved, onError: (error) => show(requestFormErrors(error, fields)) });
  }

  const control = (field: Field, hasHint = false) => ({ id: id(field), name: field, ...describedBy(id(field), fieldError(field), hasHint) });

  return (
    <form noValidate onSubmit={handleSubmit} onKeyDown={enterSubmits} className="space-y-3" aria-label={site ? `Edit site ${site.client}` : 'New site'}>
      <FormField id={id('client')} label="Client" error={fieldError('client')}>
        <input {...control('client')} defaultValue={site?.client} autoComplete="off" className={inputClass} />
      </FormField>
      <FormField id={id('address')} label="Installation address" error={fieldError('address')}>
        <input {...control('address')} defaultValue={site?.address} autoComplete="off" className={inputClass} />
      </FormField>
      <FormField id={id('description')} label="What the installation is" hint="e.g. three-storey office, ground-floor shop with flat above" error={fieldError('description')}>
        <input {...control('description', true)} defaultValue={site?.description} autoComplete="off" className={inputClass} />
      </FormField>
      <div className="grid gap-3 sm:grid-cols-2">
        <FormField id={id('contactName')} label="Contact name" error={fieldError('contactName')}>
          <input {...control('contactName')} defaultValue={site?.contactName} autoComplete="off" className={inputClass} />
        </FormField>
        <FormField id={id('contactEmail')} label="Contact e-mail" hint="Where the issued document is sent" error={fieldError('contactEmail')}>
          <input {...control('contactEmail', true)} type="email" defaultValue={site?.contactEmail} autoComplete="off" spellCheck={false} className={inputClass} />
        </FormField>
      </div>
      <FormField id={id('earthing')} label="Earthing arrangement" error={fieldError('earthing')}>
        <select {...control('earthing')} defaultValue={site?.earthing ?? 'TN-C-S'} className={inputClass}>
          {earthingArrangements.map((arrangement) => (
            <option key={arrangement} value={arrangement}>
              {earthingWords[arrangement]}
            </option>
          ))}
        </select>
      </FormField>
      <div className="grid gap-3 sm:grid-cols-3">
        <FormField id={id('nominalVoltageV')} label="U0 (V)" error={fieldError('nominalVoltageV')}>
          <input {...control('nominalVoltageV')} inputMode="decimal" defaultValue={site ? numberText(site.nominalVoltageV) : '230'} autoComplete="off" className={inputClass} />
        </FormField>
        <FormField id={id('zeOhm')} label="Ze at the origin (Ω)" error={fieldError('zeOhm')}>
          <input {...control('zeOhm')} inputMode="decimal" defaultValue={numberText(site?.zeOhm)} autoComplete="off" className={inputClass} />
        </FormField>
        <FormField id={id('pfcKa')} label="Ipf at the origin (kA)" error={fieldError('pfcKa')}>
          <input {...control('pfcKa')} inputMode="decimal" defaultValue={numberText(site?.pfcKa)} autoComplete="off" className={inputClass} />
        </FormField>
      </div>
      <FormFooter pending={pending} label={site ? 'Save the site' : 'Add the site'} pendingLabel="Saving…" formError={errors?.form} />
    </form>
  );
}
