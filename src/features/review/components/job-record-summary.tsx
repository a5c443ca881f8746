import type { ReactNode } from 'react';
import { inspectionAreas } from '../../../../shared/schemas/inspection-items.ts';
import { overallAssessment, type JobSectionData, type Observation } from '../../../../shared/schemas/job-record.ts';
import type { Job } from '../../../../shared/schemas/sites.ts';

const show = (value: unknown, unit = '') => (value === null || value === undefined || value === '' ? <span className="text-danger">not given</span> : `${String(value)}${unit}`);

function Row({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="flex gap-2">
      <dt className="w-44 shrink-0 text-muted">{label}</dt>
      <dd className="min-w-0">{children}</dd>
    </div>
  );
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="space-y-1 border-t border-line pt-2">
      <h3 className="font-semibold">{title}</h3>
      {children}
    </section>
  );
}

/**
 * The job record as a reviewer reads it beside the schedules: the parts the gate asks for
 * (supply, extent and limitations, inspections, observations, summary, declaration), with blanks
 * said in words. Read only: the record is changed on the job screen.
 */
export function JobRecordSummary({ job, record }: { job: Job; record: JobSectionData }) {
  const { supply, extent, summary, declaration } = record;
  const observations = Object.values(record.observations)
    .filter((o): o is Observation => o !== null)
    .sort((a, b) => a.number - b.number);
  const outcomes = new Map<string, number>();
  let blank = 0;
  for (const area of inspectionAreas) {
    for (const item of area.items) {
      const outcome = record.inspections[item.id];
      if (!outcome) blank++;
      else outcomes.set(outcome, (outcomes.get(outcome) ?? 0) + 1);
    }
  }
  const assessment = job.kind === 'EICR' ? overallAssessment(record.observations) : null;
  const person = (p: { name: string; position: string; date: string }) => (p.name.trim() ? `${p.name}${p.position ? `, ${p.position}` : ''}${p.date ? ` (${p.date})` : ''}` : show(''));

  return (
    <div className="space-y-3 text-sm">
      <Section title="Supply characteristics">
        <dl className="space-y-0.5">
          <Row label="Earthing">{show(supply.earthing)}</Row>
          <Row label="Live conductors">{show(supply.liveConductors)}</Row>
          <Row label="U0 / U">
            {show(supply.u0V, ' V')} / {show(supply.uV, ' V')}
          </Row>
          <Row label="Frequency">{show(supply.frequencyHz, ' Hz')}</Row>
          <Row label="Ze">{show(supply.zeOhm, ' Ω')}</Row>
          <Row label="Ipf at the origin">{show(supply.ipfKa, ' kA')}</Row>
        </dl>
      </Section>

      {job.kind === 'EIC' ? (
        <Section title="The work">
          <dl className="space-y-0.5">
            <Row label="Description">{show(record.work.description)}</Row>
            <Row label="Extent">{show(record.work.extent)}</Row>
            <Row label="Departures">{record.work.departures || 'none'}</Row>
          </dl>
        </Section>
      ) : null}

      <Section title="Extent and limitations">
        {job.kind === 'EICR' && (
          <dl>
            <Row label="Covered">{show(extent.extentCovered)}</Row>
          </dl>
        )}
        {extent.limitations.length === 0 ? (
          <p className="text-muted">No limitations recorded.</p>
        ) : (
          <ol className="list-decimal space-y-0.5 pl-5">
            {extent.limitations.map((l, i) => (
              <li key={i}>
                {l.kind === 'agreed' ? 'Agreed' : 'Operational'}: {l.what || show('')} — {l.reason ? `because ${l.reason}` : <span className="text-danger">no reason given</span>}
              </li>
            ))}
          </ol>
        )}
        {extent.limitations.some((l) => l.kind === 'agreed') && (
          <dl>
            <Row label="Agreed with">{show(extent.agreedWith)}</Row>
          </dl>
        )}
      </Section>

      <Section title="Schedule of inspections">
        <p>
          {[...outcomes.entries()].map(([outcome, n]) => `${outcome === 'ok' ? '✓' : outcome === 'fail' ? '✗' : outcome} ${n}`).join(' · ') || 'Nothing recorded.'}
          {blank > 0 && <span className="text-danger"> · {blank} left blank</span>}
        </p>
      </Section>

      {job.kind === 'EICR' && (
        <Section title="Observations">
          {observations.length === 0 ? (
            <p className="text-muted">No observations.</p>
          ) : (
            <ol className="space-y-0.5">
              {observations.map((o) => (
                <li key={o.number}>
                  <span className="font-medium">{o.number}.</span> {o.text}
                  {o.location && <span className="text-muted"> ({o.location})</span>} —{' '}
                  {o.code ? <span className="font-semibold">{o.code}</span> : <span className="text-danger">no code yet</span>}
                </li>
              ))}
            </ol>
          )}
        </Section>
      )}

      <Section title="Summary">
        <dl className="space-y-0.5">
          {assessment && <Row label="Overall assessment">{`${assessment.assessment} — ${assessment.reason}`}</Row>}
          {job.kind === 'EICR' && <Row label="General condition">{show(summary.generalCondition)}</Row>}
          <Row label={job.kind === 'EIC' ? 'First inspection in' : 'Next inspection in'}>
            {summary.nextInspectionMonths === null ? show(null) : `${summary.nextInspectionMonths} months${summary.nextInspectionReason ? ` (${summary.nextInspectionReason})` : ''}`}
          </Row>
        </dl>
      </Section>

      <Section title="Declaration">
        <dl className="space-y-0.5">
          {job.kind === 'EIC' && !declaration.samePersonForAll && (
            <>
              <Row label="Design">{person(declaration.designer)}</Row>
              <Row label="Construction">{person(declaration.constructor)}</Row>
            </>
          )}
          <Row label={job.kind === 'EIC' && declaration.samePersonForAll ? 'Design, construction, inspection' : 'Inspection and testing'}>{person(declaration.inspector)}</Row>
        </dl>
      </Section>
    </div>
  );
}
