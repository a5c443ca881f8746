import { useEffect, useImperativeHandle, useMemo, useState, type KeyboardEvent, type Ref } from 'react';
import { inspectionAreas } from '../../../../shared/schemas/inspection-items.ts';
import type { InspectionOutcome } from '../../../../shared/schemas/job-record.ts';
import { RecordSection } from './record-sections.tsx';
import { fieldDomId, useRecord } from './record-context.tsx';
import { useSyncExternalStore } from 'react';

/** How each outcome reads on screen. */
export const outcomeWords: Record<InspectionOutcome, string> = {
  ok: '✓ acceptable',
  fail: '✗ not acceptable',
  C1: 'C1 danger present',
  C2: 'C2 potentially dangerous',
  C3: 'C3 improvement recommended',
  LIM: 'LIM limitation',
  'N/A': 'N/A',
  'not-verified': 'not verified',
};

/** One key per outcome. Which are offered depends on the kind of job (see `outcomeKeysFor`). */
const outcomeKeys: ReadonlyArray<{ key: string; outcome: InspectionOutcome; only?: 'EIC' | 'EICR' }> = [
  { key: 'v', outcome: 'ok' },
  { key: 'x', outcome: 'fail', only: 'EIC' },
  { key: '1', outcome: 'C1', only: 'EICR' },
  { key: '2', outcome: 'C2', only: 'EICR' },
  { key: '3', outcome: 'C3', only: 'EICR' },
  { key: 'l', outcome: 'LIM' },
  { key: 'n', outcome: 'N/A' },
  { key: 'u', outcome: 'not-verified' },
];

export const outcomeKeysFor = (kind: 'EIC' | 'EICR') => outcomeKeys.filter((k) => !k.only || k.only === kind);

const flatItems = inspectionAreas.flatMap((area) => area.items.map((item) => ({ ...item, area })));
const rowId = (itemId: string) => `job-inspection-${itemId.replace(/\./g, '-')}`;

export interface InspectionsHandle {
  /** Puts the cursor on the grid at this item. */
  focusItem(itemId: string): void;
}

/**
 * The schedule of inspections as a keyboard grid: ↑/↓ move through the items (across areas),
 * PageUp/PageDown jump between areas, Home/End to the first and last item; one key sets an outcome
 * and moves on; Delete or Backspace clears. On a report, C1, C2 or C3 opens the observation that
 * says what was found, tied to the item.
 */
export function InspectionsSchedule({
  handleRef,
  onNeedsObservation,
}: {
  handleRef?: Ref<InspectionsHandle>;
  onNeedsObservation: (itemId: string, code: 'C1' | 'C2' | 'C3') => void;
}) {
  const { detail, saver, readOnlyReason } = useRecord();
  const kind = detail.job.kind as 'EIC' | 'EICR';
  const keys = useMemo(() => outcomeKeysFor(kind), [kind]);
  const [active, setActive] = useState(0);
  const [message, setMessage] = useState('');
  const stored = detail.record.inspections.data;
  // Re-render on any save state change: the grid shows outcomes being saved at once.
  useSyncExternalStore(saver.subscribe, () => saver.revision);
  const gridId = fieldDomId('inspections', 'grid');

  useImperativeHandle(handleRef, () => ({
    focusItem(itemId: string) {
      const index = flatItems.findIndex((item) => item.id === itemId);
      if (index >= 0) setActive(index);
      document.getElementById(gridId)?.focus();
    },
  }));

  const outcomeOf = (itemId: string): InspectionOutcome | null => {
    const state = saver.state('inspections', itemId);
    if (state?.status === 'saving' || state?.status === 'error') return state.value as InspectionOutcome | null;
    if (state?.status === 'conflict') return state.mine as InspectionOutcome | null;
    return stored[itemId] ?? null;
  };

  // Keep the active item in view while the person moves through the grid (not when the page opens).
  useEffect(() => {
    const grid = document.getElementById(gridId);
    if (grid && grid === document.activeElement) document.getElementById(rowId(flatItems[active]!.id))?.scrollIntoView({ block: 'nearest' });
  }, [active, gridId]);

  const activeItem = flatItems[active]!;
  const activeState = saver.state('inspections', activeItem.id);

  function set(outcome: InspectionOutcome | null) {
    const item = flatItems[active]!;
    if (readOnlyReason) {
      setMessage(readOnlyReason);
      return;
    }
    setMessage('');
    void saver.save('inspections', item.id, outcome);
    // Move on at once, so the grid is at the next item when the observation form closes.
    if (outcome !== null) setActive((i) => Math.min(i + 1, flatItems.length - 1));
    if (outcome === 'C1' || outcome === 'C2' || outcome === 'C3') onNeedsObservation(item.id, outcome);
  }

  function onKeyDown(event: KeyboardEvent<HTMLDivElement>) {
    if (event.nativeEvent.isComposing || event.ctrlKey || event.metaKey || event.altKey) return;
    const areaStart = (index: number) => flatItems.findIndex((item) => item.area === flatItems[index]!.area);
    switch (event.key) {
      case 'ArrowDown':
        setActive((i) => Math.min(i + 1, flatItems.length - 1));
        break;
      case 'ArrowUp':
        setActive((i) => Math.max(i - 1, 0));
        break;
      case 'PageDown': {
        const next = flatItems.findIndex((item, i) => i > active && item.area !== activeItem.area);
        setActive(next === -1 ? flatItems.length - 1 : next);
        break;
      }
      case 'PageUp': {
        const start = areaStart(active);
        setActive(start < active ? start : start > 0 ? areaStart(start - 1) : 0);
        break;
      }
      case 'Home':
        setActive(0);
        break;
      case 'End':
        setActive(flatItems.length - 1);
        break;
      case 'Delete':
      case 'Backspace':
        set(null);
        break;
      default: {
        const match = keys.find((k) => k.key === event.key.toLowerCase());
        if (match) {
          set(match.outcome);
          break;
        }
        const other = outcomeKeys.find((k) => k.key === event.key.toLowerCase());
        if (other) {
          setMessage(
            other.outcome === 'fail'
              ? '✗ is for a certificate (EIC). On a condition report, code what was found C1, C2 or C3.'
              : `${other.outcome} is for a condition report (EICR). On a certificate, mark what is not acceptable ✗ (x) and put it right before certifying.`,
          );
          break;
        }
        return;
      }
    }
    event.preventDefault();
  }

  return (
    <RecordSection
      section="inspections"
      title="Schedule of inspections"
      intro={
        <p>
          Arrow keys move; one key sets the outcome and moves to the next item.
          {kind === 'EICR' ? ' C1, C2 or C3 asks for the observation that says what was found.' : ' Anything not acceptable must be put right before the certificate is issued.'}
        </p>
      }
    >
      <div className="flex flex-wrap gap-x-4 gap-y-1 text-xs">
        {keys.map((k) => (
          <span key={k.key}>
            <kbd className="rounded border border-line-strong bg-paper px-1 font-mono">{k.key}</kbd> {outcomeWords[k.outcome]}
          </span>
        ))}
        <span>
          <kbd className="rounded border border-line-strong bg-paper px-1 font-mono">Delete</kbd> clears
        </span>
        <span>
          <kbd className="rounded border border-line-strong bg-paper px-1 font-mono">PgUp</kbd>{' '}
          <kbd className="rounded border border-line-strong bg-paper px-1 font-mono">PgDn</kbd> previous / next area
        </span>
      </div>
      <div
        id={gridId}
        role="grid"
        aria-label="Schedule of inspections"
        aria-readonly={readOnlyReason !== null || undefined}
        aria-activedescendant={rowId(activeItem.id)}
        aria-describedby={`${gridId}-status`}
        tabIndex={0}
        onKeyDown={onKeyDown}
        className="max-h-[28rem] overflow-auto rounded border border-line focus:outline-2 focus:outline-accent"
      >
        {inspectionAreas.map((area) => {
          const items = area.items;
          return (
            <div key={area.id} role="rowgroup">
              <div role="row" className="sticky top-0 bg-paper px-2 py-1 text-xs font-semibold text-muted">
                <span role="columnheader">
                  {area.id}. {area.title}
                </span>
              </div>
              {items.map((item) => {
                const index = flatItems.findIndex((f) => f.id === item.id);
                const isActive = index === active;
                const outcome = outcomeOf(item.id);
                const state = saver.state('inspections', item.id);
                return (
                  <div
                    key={item.id}
                    id={rowId(item.id)}
                    role="row"
                    aria-selected={isActive}
                    onMouseDown={() => setActive(index)}
                    className={`grid grid-cols-[3rem_1fr_13rem] items-baseline gap-2 border-t border-line px-2 py-1 ${
                      isActive ? 'bg-accent-soft outline-2 -outline-offset-2 outline-accent' : ''
                    }`}
                  >
                    <span role="gridcell" className="font-mono text-xs text-muted">
                      {item.id}
                    </span>
                    <span role="gridcell">{item.text}</span>
                    <span
                      role="gridcell"
                      className={`${outcome === 'C1' || outcome === 'C2' || outcome === 'fail' ? 'font-semibold text-danger' : outcome === 'ok' ? 'text-ok' : ''}`}
                    >
                      {outcome ? outcomeWords[outcome] : <span className="text-muted">—</span>}
                      {state?.status === 'saving' && <span className="ml-1 text-xs text-muted">saving…</span>}
                      {state?.status === 'error' && <span className="ml-1 text-xs text-danger">not saved</span>}
                      {state?.status === 'conflict' && <span className="ml-1 text-xs text-danger">changed by someone else</span>}
                    </span>
                  </div>
                );
              })}
            </div>
          );
        })}
      </div>
      <p id={`${gridId}-status`} role="status" className="text-sm">
        <span className="font-medium">
          {activeItem.id} {activeItem.text}:
        </span>{' '}
        {outcomeOf(activeItem.id) ? outcomeWords[outcomeOf(activeItem.id)!] : 'no outcome yet'}
        {activeState?.status === 'saving' && ' · saving…'}
        {activeState?.status === 'saved' && ' · ✓ saved'}
        {activeState?.status === 'error' && <span className="text-danger"> · {activeState.message}</span>}
        {activeState?.status === 'conflict' && (
          <span className="text-danger"> · someone else set it to {activeState.theirs ? outcomeWords[activeState.theirs as InspectionOutcome] : 'blank'}; press its key again to keep yours</span>
        )}
        {message && <span className="block text-danger">{message}</span>}
      </p>
    </RecordSection>
  );
}
