import { useId, useState, type ReactNode } from 'react';
import {
  conductorMaterials,
  limitationKinds,
  liveConductorArrangements,
  meansOfEarthing,
  premisesKinds,
  reportReasons,
  type JobSectionKey,
  type Limitation,
} from '../../../../shared/schemas/job-record.ts';
import { earthingArrangements } from '../../../../shared/schemas/sites.ts';
import { ChoiceField, controlClass, DateField, FieldStatus, LongTextField, NumberField, plainOptions, TextField } from './record-fields.tsx';
import { fieldDomId, sectionDomId, useFieldState, useRecord } from './record-context.tsx';

/** A section of the record: a heading (the "go to" target) and its fields. */
export function RecordSection({ section, title, intro, children }: { section: JobSectionKey; title: string; intro?: ReactNode; children: ReactNode }) {
  return (
    <section aria-labelledby={sectionDomId(section)} className="space-y-3 rounded border border-line bg-surface p-4">
      <h2 id={sectionDomId(section)} tabIndex={-1} className="text-base font-semibold focus:outline-none">
        {title}
      </h2>
      {intro && <div className="text-muted">{intro}</div>}
      {children}
    </section>
  );
}

const grid2 = 'grid gap-3 sm:grid-cols-2';
const grid3 = 'grid gap-3 sm:grid-cols-3';

export const reasonWords: Record<(typeof reportReasons)[number], string> = {
  periodic: 'Periodic inspection',
  sale: 'The property is being sold',
  letting: 'The property is being let',
  'change-of-occupancy': 'A new occupier is moving in',
  insurance: 'Asked for by an insurer',
  'alterations-planned': 'Before planned alterations',
  other: 'Another reason (say below)',
};

export const premisesWords: Record<(typeof premisesKinds)[number], string> = {
  domestic: 'Home, lived in by its owner',
  'rented-dwelling': 'Rented home',
  commercial: 'Shop, office or other commercial premises',
  industrial: 'Industrial premises',
  caravan: 'Caravan or caravan park',
  'pool-or-similar': 'Swimming pool or similar',
  other: 'Other',
};

const yesNoOptions = [
  { value: 'yes', label: 'Yes' },
  { value: 'no', label: 'No' },
];
const bondedOptions = [
  { value: 'yes', label: 'Bonded' },
  { value: 'no', label: 'Not bonded' },
  { value: 'none', label: 'None present' },
];
const materialOptions = conductorMaterials.map((m) => ({ value: m, label: m[0]!.toUpperCase() + m.slice(1) }));

/** Who the work or report is for, and (EICR) why it was asked for. */
export function ClientSection() {
  const { detail } = useRecord();
  const isReport = detail.job.kind === 'EICR';
  return (
    <RecordSection section="client" title={isReport ? 'Who asked for the report, and why' : 'Who the work is for'}>
      <div className={grid2}>
        <TextField section="client" field="orderedBy" label={isReport ? 'Asked for by' : 'Work carried out for'} />
        <TextField section="client" field="orderedByAddress" label="Their address" />
      </div>
      {isReport && (
        <div className={grid2}>
          <ChoiceField section="client" field="reason" label="Why the report was asked for" options={reportReasons.map((r) => ({ value: r, label: reasonWords[r] }))} />
          <TextField section="client" field="reasonDetail" label="More about the reason" />
        </div>
      )}
    </RecordSection>
  );
}

/** EIC: the work the certificate covers. */
export function WorkSection() {
  return (
    <RecordSection section="work" title="The work this certificate covers">
      <LongTextField section="work" field="description" label="What was done" />
      <LongTextField section="work" field="extent" label="How far the certificate reaches" hint="Which circuits and parts of the installation the new work includes." />
      <LongTextField section="work" field="departures" label="Departures from BS 7671" hint="Each with its reason; leave blank when there are none." />
      <LongTextField section="work" field="existingInstallationComments" label="Comments on the existing installation" />
    </RecordSection>
  );
}

export function InstallationSection() {
  const { detail } = useRecord();
  const isReport = detail.job.kind === 'EICR';
  return (
    <RecordSection section="installation" title="The installation">
      <div className={grid2}>
        <ChoiceField
          section="installation"
          field="premises"
          label="Kind of premises"
          hint="Sets the usual interval to the next inspection."
          options={premisesKinds.map((p) => ({ value: p, label: premisesWords[p] }))}
        />
        {isReport && <NumberField section="installation" field="wiringAgeYears" label="Estimated age of the wiring (years)" />}
      </div>
      {isReport && (
        <div className={grid3}>
          <ChoiceField
            section="installation"
            field="alterationsEvident"
            label="Signs of alterations or additions"
            options={[...yesNoOptions, { value: 'unknown', label: 'Cannot tell' }]}
          />
          <NumberField section="installation" field="alterationsAgeYears" label="Their estimated age (years)" />
          <DateField section="installation" field="lastInspectionDate" label="Date of the last inspection" hint="YYYY-MM-DD, if known" />
        </div>
      )}
      <div className={grid2}>
        <ChoiceField section="installation" field="recordsAvailable" label="Earlier certificates or records available" options={yesNoOptions} />
        <TextField section="installation" field="recordsHeldBy" label="Held by" />
      </div>
    </RecordSection>
  );
}

export function SupplySection() {
  return (
    <RecordSection section="supply" title="Supply characteristics and earthing arrangements">
      <div className={grid2}>
        <ChoiceField section="supply" field="earthing" label="Earthing system" options={plainOptions(earthingArrangements)} />
        <ChoiceField section="supply" field="liveConductors" label="Number and type of live conductors" options={plainOptions(liveConductorArrangements)} />
      </div>
      <div className={grid3}>
        <NumberField section="supply" field="u0V" label="Nominal voltage to earth U0 (V)" />
        <NumberField section="supply" field="uV" label="Nominal voltage between lines U (V)" />
        <NumberField section="supply" field="frequencyHz" label="Frequency (Hz)" />
        <NumberField section="supply" field="zeOhm" label="External loop impedance Ze (Ω)" />
        <NumberField section="supply" field="ipfKa" label="Prospective fault current Ipf (kA)" />
        <NumberField section="supply" field="supplyNeutralCsaMm2" label="Supply neutral csa (mm²)" hint="Sets the main bonding size on a PME supply." />
      </div>
      <fieldset className="space-y-2">
        <legend className="font-medium">The supply’s own protective device</legend>
        <div className={grid3}>
          <TextField section="supply" field="supplyDeviceStandard" label="Standard (BS or BS EN)" />
          <TextField section="supply" field="supplyDeviceType" label="Type" />
          <NumberField section="supply" field="supplyDeviceRatingA" label="Rating (A)" />
        </div>
      </fieldset>
    </RecordSection>
  );
}

export function OriginSection() {
  const { detail } = useRecord();
  const electrode = detail.record.origin.data.meansOfEarthing === 'electrode';
  return (
    <RecordSection section="origin" title="Particulars at the origin">
      <ChoiceField
        section="origin"
        field="meansOfEarthing"
        label="Means of earthing"
        options={meansOfEarthing.map((m) => ({ value: m, label: m === 'supplier' ? 'The supplier’s earthing facility' : 'An earth electrode of the installation' }))}
      />
      {electrode && (
        <div className={grid3}>
          <TextField section="origin" field="electrodeType" label="Electrode type" hint="rod, tape, plate…" />
          <TextField section="origin" field="electrodeLocation" label="Where it is" />
          <NumberField section="origin" field="electrodeRaOhm" label="Electrode resistance RA (Ω)" />
        </div>
      )}
      <fieldset className="space-y-2">
        <legend className="font-medium">Main switch or circuit-breaker</legend>
        <div className={grid3}>
          <TextField section="origin" field="mainSwitchStandard" label="Standard (BS or BS EN)" />
          <ChoiceField section="origin" field="mainSwitchPoles" label="Poles" asNumber options={['1', '2', '3', '4'].map((n) => ({ value: n, label: n }))} />
          <NumberField section="origin" field="mainSwitchRatingA" label="Rating (A)" />
          <NumberField section="origin" field="mainSwitchRcdMa" label="If an RCD: IΔn (mA)" />
          <NumberField section="origin" field="mainSwitchRcdTimeMs" label="If an RCD: operating time (ms)" />
        </div>
      </fieldset>
      <fieldset className="space-y-2">
        <legend className="font-medium">Earthing conductor and main protective bonding conductors</legend>
        <div className={grid3}>
          <ChoiceField section="origin" field="earthingConductorMaterial" label="Earthing conductor: material" options={materialOptions} />
          <NumberField section="origin" field="earthingConductorCsaMm2" label="Earthing conductor: csa (mm²)" />
          <ChoiceField section="origin" field="earthingConductorVerified" label="Earthing conductor: connection verified" options={yesNoOptions} />
          <ChoiceField section="origin" field="bondingConductorMaterial" label="Main bonding: material" options={materialOptions} />
          <NumberField section="origin" field="bondingConductorCsaMm2" label="Main bonding: csa (mm²)" />
          <ChoiceField section="origin" field="bondingVerified" label="Main bonding: continuity verified" options={yesNoOptions} />
        </div>
      </fieldset>
      <fieldset className="space-y-2">
        <legend className="font-medium">Bonding of extraneous-conductive-parts</legend>
        <div className={grid3}>
          <ChoiceField section="origin" field="bondedWater" label="Water pipes" options={bondedOptions} />
          <ChoiceField section="origin" field="bondedGas" label="Gas pipes" options={bondedOptions} />
          <ChoiceField section="origin" field="bondedOil" label="Oil pipes" options={bondedOptions} />
          <ChoiceField section="origin" field="bondedStructuralSteel" label="Structural steel" options={bondedOptions} />
          <ChoiceField section="origin" field="bondedLightningProtection" label="Lightning protection" options={bondedOptions} />
          <TextField section="origin" field="bondedOther" label="Other parts bonded" />
        </div>
      </fieldset>
    </RecordSection>
  );
}

const limitationKindWords: Record<(typeof limitationKinds)[number], string> = {
  agreed: 'Agreed beforehand',
  operational: 'Found on the day',
};

/**
 * Extent and limitations. The list of limitations is saved as a whole when a row is added,
 * removed, or one of its fields is left; each limitation needs its reason.
 */
export function ExtentSection() {
  const { detail, saver, readOnlyReason } = useRecord();
  const stored = detail.record.extent.data.limitations;
  const state = useFieldState('extent', 'limitations');
  const [draft, setDraft] = useState<Limitation[] | null>(null);
  const rows = draft ?? (state?.status === 'saving' || state?.status === 'error' ? (state.value as Limitation[]) : stored);
  const listId = fieldDomId('extent', 'limitations');
  const baseId = useId();
  const readOnly = readOnlyReason !== null;

  async function save(next: Limitation[]) {
    setDraft(next);
    const outcome = await saver.save('extent', 'limitations', next);
    if (outcome === 'saved' || outcome === 'conflict') setDraft((now) => (now === next ? null : now));
  }

  const update = (index: number, change: Partial<Limitation>) => setDraft(rows.map((row, i) => (i === index ? { ...row, ...change } : row)));
  const commitIfChanged = () => {
    if (draft && JSON.stringify(draft) !== JSON.stringify(stored)) void save(draft);
  };

  return (
    <RecordSection section="extent" title="Extent and limitations">
      <LongTextField section="extent" field="extentCovered" label="What the inspection and testing covered" />
      <TextField section="extent" field="agreedWith" label="Limitations agreed with" hint="Name and role of the person who agreed them." />
      <div className="space-y-2">
        <h3 id={listId} tabIndex={-1} className="font-medium focus:outline-none">
          Limitations ({rows.length})
        </h3>
        {rows.length === 0 && <p className="text-muted">None recorded.</p>}
        <ol className="space-y-2">
          {rows.map((row, index) => (
            <li key={index} className="grid gap-2 rounded border border-line p-2 sm:grid-cols-[12rem_1fr_1fr_auto]">
              <div className="space-y-1">
                <label htmlFor={`${baseId}-kind-${index}`} className="block text-xs font-medium">
                  Limitation {index + 1}: kind
                </label>
                <select
                  id={`${baseId}-kind-${index}`}
                  data-record-field
                  value={row.kind}
                  disabled={readOnly}
                  onChange={(event) => void save(rows.map((r, i) => (i === index ? { ...r, kind: event.target.value as Limitation['kind'] } : r)))}
                  className={controlClass}
                >
                  {limitationKinds.map((kind) => (
                    <option key={kind} value={kind}>
                      {limitationKindWords[kind]}
                    </option>
                  ))}
                </select>
              </div>
              <div className="space-y-1">
                <label htmlFor={`${baseId}-what-${index}`} className="block text-xs font-medium">
                  What was not inspected or tested
                </label>
                <input
                  id={`${baseId}-what-${index}`}
                  data-record-field
                  value={row.what}
                  readOnly={readOnly}
                  onChange={(event) => update(index, { what: event.target.value })}
                  onBlur={commitIfChanged}
                  className={controlClass}
                />
              </div>
              <div className="space-y-1">
                <label htmlFor={`${baseId}-reason-${index}`} className="block text-xs font-medium">
                  Why
                </label>
                <input
                  id={`${baseId}-reason-${index}`}
                  data-record-field
                  value={row.reason}
                  readOnly={readOnly}
                  aria-invalid={row.what.trim() !== '' && row.reason.trim() === '' ? true : undefined}
                  onChange={(event) => update(index, { reason: event.target.value })}
                  onBlur={commitIfChanged}
                  className={controlClass}
                />
                {row.what.trim() !== '' && row.reason.trim() === '' && <p className="text-xs text-danger">Give the reason for this limitation.</p>}
              </div>
              <div className="self-end">
                <button
                  type="button"
                  disabled={readOnly}
                  onClick={() => void save(rows.filter((_, i) => i !== index))}
                  className="rounded border border-line-strong px-2 py-1 hover:bg-danger-soft"
                  aria-label={`Remove limitation ${index + 1}`}
                >
                  Remove
                </button>
              </div>
            </li>
          ))}
        </ol>
        <button
          type="button"
          disabled={readOnly}
          onClick={() => {
            const next = [...rows, { kind: 'agreed' as const, what: '', reason: '' }];
            setDraft(next);
            // The new row's first field takes the cursor; the row is saved when it is left.
            requestAnimationFrame(() => document.getElementById(`${baseId}-kind-${next.length - 1}`)?.focus());
          }}
          className="rounded border border-line-strong px-2 py-1 hover:bg-accent-soft"
        >
          Add a limitation
        </button>
        <FieldStatus id={listId} section="extent" field="limitations" state={state} onTakeTheirs={() => setDraft(null)} />
      </div>
    </RecordSection>
  );
}
