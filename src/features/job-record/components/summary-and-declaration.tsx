import { useState, useSyncExternalStore } from 'react';
import { nextInspectionDate, overallAssessment, usualIntervalMonths, type DeclarationPerson, type Observation } from '../../../../shared/schemas/job-record.ts';
import { fieldDomId, useFieldState, useRecord } from './record-context.tsx';
import { controlClass, FieldStatus, LongTextField, NumberField, TextField } from './record-fields.tsx';
import { premisesWords, RecordSection } from './record-sections.tsx';

/** The last day of the visit: the date the next inspection is counted from. */
export function lastVisitDay(job: { visitDate: string; visitEndDate: string | null }): string {
  return job.visitEndDate ?? job.visitDate;
}

function longDate(iso: string): string {
  const date = new Date(`${iso}T00:00:00`);
  return Number.isNaN(date.getTime()) ? iso : date.toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric' });
}

/**
 * The summary: on a report, the overall assessment derived from the observations (never typed),
 * with its reason; the recommended interval with the usual one for the premises as guidance, and
 * the date it gives.
 */
export function SummarySection() {
  const { detail, saver } = useRecord();
  useSyncExternalStore(saver.subscribe, () => saver.revision);
  const isReport = detail.job.kind === 'EICR';
  // Observations being saved count at once: the assessment follows what was just entered.
  const observations: Record<string, Observation | null> = { ...detail.record.observations.data };
  for (const id of Object.keys(observations)) {
    const state = saver.state('observations', id);
    if (state?.status === 'saving') observations[id] = state.value as Observation | null;
  }
  const assessment = overallAssessment(observations);
  const premises = detail.record.installation.data.premises;
  const usual = premises ? usualIntervalMonths[premises] : null;
  const months = detail.record.summary.data.nextInspectionMonths;
  const due = nextInspectionDate(lastVisitDay(detail.job), months);
  const shorter = usual !== null && months !== null && months < usual;

  return (
    <RecordSection section="summary" title="Summary">
      {isReport && (
        <div
          id={fieldDomId('summary', 'assessment')}
          tabIndex={-1}
          className={`rounded border px-3 py-2 ${
            assessment.assessment === 'unsatisfactory' ? 'border-danger bg-danger-soft' : assessment.assessment === 'satisfactory' ? 'border-ok bg-ok-soft' : 'border-line'
          }`}
        >
          <p>
            Overall assessment of the installation:{' '}
            <strong data-testid="overall-assessment" className={assessment.assessment === 'unsatisfactory' ? 'text-danger' : assessment.assessment === 'satisfactory' ? 'text-ok' : ''}>
              {assessment.assessment}
            </strong>
          </p>
          <p role="status" className="text-sm">
            {assessment.reason}
          </p>
          <p className="text-xs text-muted">Worked out from the observations’ codes; it cannot be typed.</p>
        </div>
      )}
      {isReport && <LongTextField section="summary" field="generalCondition" label="General condition of the installation, in words" />}
      <div className="grid gap-3 sm:grid-cols-2">
        <NumberField
          section="summary"
          field="nextInspectionMonths"
          label={isReport ? 'Next inspection recommended in (months)' : 'First inspection recommended in (months)'}
          hint={
            usual !== null && premises
              ? `Guidance: usually ${usual} months for ${premisesWords[premises].toLowerCase()} (IET Guidance Note 3, from memory). You may recommend less and say why.`
              : 'Choose the kind of premises under “The installation” to see the usual interval (guidance).'
          }
        />
        <div className="space-y-1">
          <p className="font-medium">Which gives</p>
          <p id={fieldDomId('summary', 'nextInspectionDate')} className="py-1">
            {due ? longDate(due) : <span className="text-muted">a date once the interval is given</span>}
          </p>
          <p className="text-xs text-muted">Counted from the last day of the visit ({longDate(lastVisitDay(detail.job))}).</p>
        </div>
      </div>
      <TextField
        section="summary"
        field="nextInspectionReason"
        label="Why this interval"
        hint={shorter ? 'Shorter than usual: say why.' : 'Needed when the interval is shorter than usual.'}
      />
    </RecordSection>
  );
}

type Role = 'designer' | 'constructor' | 'inspector' | 'reviewer';

/** One person of the declaration: name, position and date, saved together when a field is left. */
function PersonFields({ role, title, note }: { role: Role; title: string; note?: string }) {
  const { detail, saver, readOnlyReason } = useRecord();
  const stored = detail.record.declaration.data[role];
  const state = useFieldState('declaration', role);
  const [draft, setDraft] = useState<DeclarationPerson | null>(null);
  const person = draft ?? (state?.status === 'saving' || state?.status === 'error' ? (state.value as DeclarationPerson) : state?.status === 'conflict' ? (state.mine as DeclarationPerson) : stored);
  const id = fieldDomId('declaration', role);

  async function commit() {
    if (!draft || JSON.stringify(draft) === JSON.stringify(stored)) {
      setDraft(null);
      return;
    }
    const sent = draft;
    const outcome = await saver.save('declaration', role, sent);
    if (outcome === 'saved' || outcome === 'conflict') setDraft((now) => (now === sent ? null : now));
  }

  const input = (field: keyof DeclarationPerson, label: string, placeholder?: string) => (
    <div className="space-y-1">
      <label htmlFor={field === 'name' ? id : `${id}-${field}`} className="block text-sm font-medium">
        {label}
      </label>
      <input
        id={field === 'name' ? id : `${id}-${field}`}
        data-record-field
        value={person[field]}
        readOnly={readOnlyReason !== null}
        placeholder={placeholder}
        autoComplete="off"
        onChange={(event) => setDraft({ ...person, [field]: event.target.value })}
        onBlur={() => void commit()}
        onKeyDown={(event) => {
          if (event.key === 'Enter') {
            event.preventDefault();
            const fields = [...document.querySelectorAll<HTMLElement>('[data-record-field]')];
            fields[fields.indexOf(event.currentTarget) + 1]?.focus();
          }
        }}
        aria-describedby={`${id}-status`}
        className={controlClass}
      />
    </div>
  );

  return (
    <fieldset className="space-y-2 rounded border border-line p-2">
      <legend className="px-1 font-medium">{title}</legend>
      {note && <p className="text-xs text-muted">{note}</p>}
      <div className="grid gap-2 sm:grid-cols-3">
        {input('name', 'Name')}
        {input('position', 'Position')}
        {input('date', 'Date', 'YYYY-MM-DD')}
      </div>
      <FieldStatus id={id} section="declaration" field={role} state={state} onTakeTheirs={() => setDraft(null)} />
    </fieldset>
  );
}

/**
 * The people responsible. A certificate names who designed, built, and inspected and tested the
 * work (or one person for all three); a report names its inspector and the reviewer. Signing
 * belongs to the review.
 */
export function DeclarationSection() {
  const { detail, saver, readOnlyReason } = useRecord();
  const isReport = detail.job.kind === 'EICR';
  const same = detail.record.declaration.data.samePersonForAll;
  const sameState = useFieldState('declaration', 'samePersonForAll');
  const sameId = fieldDomId('declaration', 'samePersonForAll');
  return (
    <RecordSection section="declaration" title="Declaration">
      {isReport ? (
        <>
          <PersonFields role="inspector" title="Inspected and tested by" />
          <PersonFields role="reviewer" title="Reviewed by" note="The qualified supervisor who checks the report before it is issued." />
        </>
      ) : (
        <>
          <div className="flex items-center gap-2">
            <input
              id={sameId}
              type="checkbox"
              data-record-field
              checked={same}
              disabled={readOnlyReason !== null}
              onChange={(event) => void saver.save('declaration', 'samePersonForAll', event.target.checked)}
              aria-describedby={`${sameId}-status`}
            />
            <label htmlFor={sameId}>One person designed, built, and inspected and tested the work</label>
          </div>
          <FieldStatus id={sameId} section="declaration" field="samePersonForAll" state={sameState} />
          {same ? (
            <PersonFields role="inspector" title="Designed, built, inspected and tested by" />
          ) : (
            <>
              <PersonFields role="designer" title="Designed by" />
              <PersonFields role="constructor" title="Built by" />
              <PersonFields role="inspector" title="Inspected and tested by" />
            </>
          )}
        </>
      )}
    </RecordSection>
  );
}
