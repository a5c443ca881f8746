import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useMemo, useState, type FormEvent } from 'react';
import type { BoardDetail } from '../../../../../shared/schemas/boards.ts';
import { columnByKey, type ReadingKey } from '../../../../../shared/schemas/columns.ts';
import type { Finding } from '../../../../../shared/schemas/findings.ts';
import { importTargets, type ImportReadResponse, type ImportTarget } from '../../../../../shared/schemas/import.ts';
import { applySavedMapping, targetLabel, type ProposedColumn } from '../../../../../shared/import/map-columns.ts';
import { cellKey, choiceFor, findingsAfter, planImport, writesFor, type ConflictChoices, type PreviewCell } from '../../../../../shared/import/plan-import.ts';
import { FormDialog } from '../../../../components/form-dialog.tsx';
import { ApiError } from '../../../../lib/api-client.ts';
import { readImportFile, saveImportMapping, savedMappingsQueryOptions, sendImportBatch } from '../api/import-api.ts';

/** What the console is told when an import has landed: enough to undo it as one step. */
export interface ImportDone {
  fileName: string;
  written: number;
  /** Each written cell: its text before and after. */
  changes: Array<{ circuitId: number; column: ReadingKey; before: string; after: string }>;
}

export interface ImportDialogProps {
  detail: BoardDetail;
  onClose: () => void;
  onImported: (done: ImportDone) => void;
}

type Step =
  | { kind: 'file'; error: string | null; progress: number | null }
  | { kind: 'mapping'; read: ImportReadResponse; targets: ImportTarget[]; why: string[] }
  | { kind: 'preview'; read: ImportReadResponse; targets: ImportTarget[] }
  | { kind: 'writing'; count: number };

const messageOf = (error: unknown) => (error instanceof Error ? error.message : 'That did not work.');
const separatorWords: Record<string, string> = { ',': 'commas', ';': 'semicolons', '\t': 'tabs' };

/**
 * Importing an instrument's readings file: choose the file → check the proposed mapping of its
 * columns (each a select; a saved mapping can be applied, the corrected one saved under a name) →
 * preview every value against the board with conflicts to settle and the findings as they would
 * be → confirm, written in one transaction. Keyboard throughout: Tab moves, Enter goes on, Esc closes.
 */
export function ImportDialog({ detail, onClose, onImported }: ImportDialogProps) {
  const [step, setStep] = useState<Step>({ kind: 'file', error: null, progress: null });
  const boardId = detail.board.id;

  const onFile = async (file: File | undefined) => {
    if (!file) return;
    setStep({ kind: 'file', error: null, progress: 0 });
    try {
      const read = await readImportFile(boardId, file, (fraction) => setStep({ kind: 'file', error: null, progress: fraction }));
      setStep({ kind: 'mapping', read, targets: read.proposal.map((p) => p.target), why: read.proposal.map((p) => p.why) });
    } catch (error) {
      setStep({ kind: 'file', error: messageOf(error), progress: null });
    }
  };

  return (
    <FormDialog title={`Import readings from a file — board ${detail.board.reference}`} onClose={onClose} wide>
      <div className="space-y-3 p-4 text-sm">
        <p className="text-muted">
          Readings are checked as typed ones are. Testing is for competent people after safe isolation; the file is only as good as the test behind
          it.
        </p>
        {step.kind === 'file' && <FileStep error={step.error} progress={step.progress} onFile={onFile} />}
        {step.kind === 'mapping' && (
          <MappingStep
            read={step.read}
            targets={step.targets}
            why={step.why}
            onChange={(targets, why) => setStep({ ...step, targets, why })}
            onNext={() => setStep({ kind: 'preview', read: step.read, targets: step.targets })}
          />
        )}
        {step.kind === 'preview' && (
          <PreviewStep
            detail={detail}
            read={step.read}
            targets={step.targets}
            onBack={() => setStep({ kind: 'mapping', read: step.read, targets: step.targets, why: step.targets.map(() => 'as chosen') })}
            onWriting={(count) => setStep({ kind: 'writing', count })}
            onDone={onImported}
            onFailed={() => setStep({ kind: 'preview', read: step.read, targets: step.targets })}
          />
        )}
        {step.kind === 'writing' && (
          <div>
            <label htmlFor="import-writing" className="block">
              Writing {step.count} readings in one step…
            </label>
            <progress id="import-writing" className="w-full" aria-label="Writing the readings" />
          </div>
        )}
      </div>
    </FormDialog>
  );
}

function FileStep({ error, progress, onFile }: { error: string | null; progress: number | null; onFile: (file: File | undefined) => void }) {
  return (
    <div className="space-y-2">
      <label htmlFor="import-file" className="block font-medium">
        Readings file (comma, semicolon or tab separated; UTF-8 or Windows-1252)
      </label>
      <input
        id="import-file"
        type="file"
        accept=".csv,.tsv,.txt,text/csv,text/plain,text/tab-separated-values"
        aria-describedby={error ? 'import-file-error' : undefined}
        aria-invalid={error ? true : undefined}
        onChange={(e) => onFile(e.currentTarget.files?.[0])}
        className="block"
      />
      {progress !== null && (
        <div>
          <label htmlFor="import-reading" className="block text-muted">
            Reading the file… {Math.round(progress * 100)}%
          </label>
          <progress id="import-reading" className="w-full" max={1} value={progress} />
        </div>
      )}
      {error && (
        <p id="import-file-error" role="alert" className="text-error">
          {error}
        </p>
      )}
    </div>
  );
}

function MappingStep({
  read,
  targets,
  why,
  onChange,
  onNext,
}: {
  read: ImportReadResponse;
  targets: ImportTarget[];
  why: string[];
  onChange: (targets: ImportTarget[], why: string[]) => void;
  onNext: () => void;
}) {
  const queryClient = useQueryClient();
  const saved = useQuery(savedMappingsQueryOptions());
  const [name, setName] = useState('');
  const [scope, setScope] = useState<'mine' | 'company'>('mine');
  const [saveNote, setSaveNote] = useState<{ text: string; error: boolean } | null>(null);
  const { table } = read;

  const duplicates = useMemo(() => {
    const seen = new Map<ImportTarget, number>();
    const dup = new Set<ImportTarget>();
    for (const t of targets) {
      if (t === 'ignore') continue;
      if (seen.has(t)) dup.add(t);
      seen.set(t, 1);
    }
    return dup;
  }, [targets]);
  const readingCount = targets.filter((t) => t !== 'ignore' && t !== 'circuit').length;
  const problem =
    duplicates.size > 0
      ? `Two file columns go to ${[...duplicates].map(targetLabel).join(', ')}: choose one.`
      : readingCount === 0
        ? 'No column goes to a reading yet: choose where at least one goes.'
        : null;

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (!problem) onNext();
  };

  const applySaved = (id: string) => {
    const mapping = saved.data?.mappings.find((m) => String(m.id) === id);
    if (!mapping) return;
    const current: ProposedColumn[] = targets.map((t, i) => ({ target: t, why: why[i] ?? '' }));
    const applied = applySavedMapping(table.headers, mapping.columns, current);
    onChange(
      applied.map((a) => a.target),
      applied.map((a) => (a.why === 'from the saved mapping' ? `from "${mapping.name}"` : a.why)),
    );
  };

  const save = async () => {
    try {
      await saveImportMapping({ name, scope, columns: table.headers.map((header, i) => ({ header, target: targets[i]! })) });
      await queryClient.invalidateQueries({ queryKey: savedMappingsQueryOptions().queryKey });
      setSaveNote({ text: `Saved as "${name.trim()}"${scope === 'company' ? ' for everyone' : ''}.`, error: false });
    } catch (error) {
      const issues = error instanceof ApiError ? error.issues.map((i) => i.message).join(' ') : '';
      setSaveNote({ text: issues || messageOf(error), error: true });
    }
  };

  return (
    <form onSubmit={submit} className="space-y-3" aria-label="Where each column of the file goes">
      <p>
        <strong>{table.fileName}</strong>: {table.rows.length} rows, separated by {separatorWords[table.delimiter]}; read as {table.encodingNote}
        {table.decimalComma ? '; numbers with a decimal comma are read with a point' : ''}.
      </p>
      {saved.data && saved.data.mappings.length > 0 && (
        <div>
          <label htmlFor="import-saved" className="mr-2">
            Use a saved mapping
          </label>
          <select id="import-saved" defaultValue="" onChange={(e) => applySaved(e.currentTarget.value)} className="rounded border border-line-strong px-1">
            <option value="">— none —</option>
            {saved.data.mappings.map((m) => (
              <option key={m.id} value={m.id}>
                {m.name} {m.scope === 'company' ? '(company)' : '(mine)'}
              </option>
            ))}
          </select>
        </div>
      )}
      <div className="max-h-[45vh] overflow-auto rounded border border-line">
        <table className="w-full text-left">
          <thead className="sticky top-0 bg-paper">
            <tr>
              <th className="px-2 py-1">File column</th>
              <th className="px-2 py-1">First values</th>
              <th className="px-2 py-1">Goes to</th>
              <th className="px-2 py-1">Why</th>
            </tr>
          </thead>
          <tbody>
            {table.headers.map((header, i) => {
              const id = `import-target-${i}`;
              return (
                <tr key={i} className="border-t border-line">
                  <td className="px-2 py-1 font-medium">
                    <label htmlFor={id}>{header || `(column ${i + 1}, unnamed)`}</label>
                  </td>
                  <td className="px-2 py-1 font-mono text-muted">{table.rows.slice(0, 3).map((r) => r[i] || '·').join('  ')}</td>
                  <td className="px-2 py-1">
                    <select
                      id={id}
                      value={targets[i]}
                      aria-invalid={duplicates.has(targets[i]!) ? true : undefined}
                      onChange={(e) => {
                        const next = [...targets];
                        next[i] = e.currentTarget.value as ImportTarget;
                        const nextWhy = [...why];
                        nextWhy[i] = 'chosen by you';
                        onChange(next, nextWhy);
                      }}
                      className="rounded border border-line-strong px-1"
                    >
                      {importTargets.map((t) => (
                        <option key={t} value={t}>
                          {targetLabel(t)}
                        </option>
                      ))}
                    </select>
                  </td>
                  <td className="px-2 py-1 text-muted">{why[i]}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {problem && (
        <p role="alert" className="text-error">
          {problem}
        </p>
      )}
      <fieldset className="flex flex-wrap items-end gap-2 rounded border border-line p-2">
        <legend className="px-1">Save this mapping for the next file</legend>
        <label className="flex flex-col">
          Name
          <input value={name} onChange={(e) => setName(e.currentTarget.value)} className="rounded border border-line-strong px-1" onKeyDown={(e) => {
            if (e.key === 'Enter') {
              e.preventDefault();
              void save();
            }
          }} />
        </label>
        <label className="flex flex-col">
          For
          <select value={scope} onChange={(e) => setScope(e.currentTarget.value as 'mine' | 'company')} className="rounded border border-line-strong px-1">
            <option value="mine">me</option>
            <option value="company">everyone in the company</option>
          </select>
        </label>
        <button type="button" onClick={() => void save()} className="rounded border border-line-strong px-2 py-0.5">
          Save mapping
        </button>
        {saveNote && (
          <span role={saveNote.error ? 'alert' : 'status'} className={saveNote.error ? 'text-error' : 'text-muted'}>
            {saveNote.text}
          </span>
        )}
      </fieldset>
      <button type="submit" disabled={problem !== null} className="rounded border border-line-strong bg-accent-soft px-3 py-1 font-medium">
        Show the preview
      </button>
    </form>
  );
}

const stateWords: Record<PreviewCell['state'], string> = { new: 'new', same: 'same', conflict: 'differs', blank: 'no value' };

function PreviewStep({
  detail,
  read,
  targets,
  onBack,
  onWriting,
  onDone,
  onFailed,
}: {
  detail: BoardDetail;
  read: ImportReadResponse;
  targets: ImportTarget[];
  onBack: () => void;
  onWriting: (count: number) => void;
  onDone: (done: ImportDone) => void;
  onFailed: () => void;
}) {
  const queryClient = useQueryClient();
  const plan = useMemo(() => planImport(read.table, targets, detail.circuits), [read, targets, detail.circuits]);
  const [choices, setChoices] = useState<ConflictChoices>({ byColumn: {}, byCell: {} });
  const [error, setError] = useState<string | null>(null);

  const writes = useMemo(() => writesFor(plan, choices), [plan, choices]);
  const after = useMemo(() => findingsAfter(detail, writes), [detail, writes]);
  const findingsByCell = useMemo(() => {
    const map = new Map<string, Finding[]>();
    for (const f of after) {
      if (f.circuitId === null) continue;
      for (const c of f.columns) {
        const key = cellKey(f.circuitId, c);
        map.set(key, [...(map.get(key) ?? []), f]);
      }
    }
    return map;
  }, [after]);

  const conflictColumns = plan.columns.filter((c) => plan.cells.some((cell) => cell.column === c && cell.state === 'conflict'));
  const unsettled = plan.cells.filter((c) => c.state === 'conflict' && choiceFor(c, choices) === undefined).length;
  const rows = useMemo(() => {
    const byCircuit = new Map<number, PreviewCell[]>();
    for (const cell of plan.cells) byCircuit.set(cell.circuitId, [...(byCircuit.get(cell.circuitId) ?? []), cell]);
    return [...byCircuit.values()];
  }, [plan]);

  const confirm = async (event: FormEvent) => {
    event.preventDefault();
    if (unsettled > 0 || writes.length === 0) return;
    const nowByCell = new Map(plan.cells.map((c) => [cellKey(c.circuitId, c.column), c.current]));
    const changes = writes.map((w) => ({ circuitId: w.circuitId, column: w.column, before: nowByCell.get(cellKey(w.circuitId, w.column)) ?? '', after: w.text }));
    onWriting(writes.length);
    try {
      const result = await sendImportBatch(queryClient, detail.board.id, { fileName: read.table.fileName, writes });
      onDone({ fileName: read.table.fileName, written: result.written, changes });
    } catch (e) {
      onFailed();
      setError(messageOf(e));
    }
  };

  return (
    <form onSubmit={confirm} className="space-y-3" aria-label="Preview of the import">
      <p role="status">
        Matched by {plan.by === 'number' ? 'circuit number' : 'order (no column names the circuit)'}: {plan.counts.new} new, {plan.counts.conflict}{' '}
        differ from the board, {plan.counts.same} already the same, {plan.counts.blank} empty in the file; {plan.unmatched.length} row
        {plan.unmatched.length === 1 ? '' : 's'} matched no circuit.
      </p>
      {plan.unmatched.length > 0 && (
        <details open className="rounded border border-line p-2">
          <summary>Rows not imported ({plan.unmatched.length})</summary>
          <ul className="list-disc pl-5" aria-label="Rows not imported">
            {plan.unmatched.map((u) => (
              <li key={u.row}>
                Row {u.row}
                {u.circuit ? ` (${u.circuit})` : ''}: {u.reason}
              </li>
            ))}
          </ul>
        </details>
      )}
      {conflictColumns.length > 0 && (
        <fieldset className="flex flex-wrap gap-3 rounded border border-line p-2">
          <legend className="px-1">Values that differ from the board: keep the board’s or take the file’s</legend>
          {conflictColumns.map((column) => (
            <label key={column} className="flex items-center gap-1">
              {columnByKey[column].label}
              <select
                value={choices.byColumn[column] ?? ''}
                onChange={(e) => {
                  const value = e.currentTarget.value as 'keep' | 'take' | '';
                  const byColumn = { ...choices.byColumn };
                  if (value === '') delete byColumn[column];
                  else byColumn[column] = value;
                  setChoices({ ...choices, byColumn });
                }}
                className="rounded border border-line-strong px-1"
                aria-label={`Every differing ${columnByKey[column].label}`}
              >
                <option value="">decide per cell</option>
                <option value="keep">keep the board’s</option>
                <option value="take">take the file’s</option>
              </select>
            </label>
          ))}
        </fieldset>
      )}
      <div className="max-h-[45vh] overflow-auto rounded border border-line">
        <table className="w-full text-left" aria-label="Values now and from the file">
          <thead className="sticky top-0 bg-paper">
            <tr>
              <th className="px-2 py-1">Circuit</th>
              {plan.columns.map((c) => (
                <th key={c} className="px-2 py-1">
                  {columnByKey[c].label}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {rows.map((cells) => (
              <tr key={cells[0]!.circuitId} className="border-t border-line align-top">
                <th scope="row" className="px-2 py-1">
                  {cells[0]!.circuitNumber} <span className="font-normal text-muted">(row {cells[0]!.row})</span>
                </th>
                {cells.map((cell) => {
                  const key = cellKey(cell.circuitId, cell.column);
                  const findings = findingsByCell.get(key) ?? [];
                  const choice = cell.state === 'conflict' ? choiceFor(cell, choices) : undefined;
                  return (
                    <td key={key} className="px-2 py-1" data-import-cell={key} data-state={cell.state}>
                      <div className="font-mono">{cell.incoming || '—'}</div>
                      <div className="text-xs text-muted">
                        {stateWords[cell.state]}
                        {cell.current && cell.state !== 'same' ? `; now ${cell.current}` : ''}
                        {cell.note ? `; ${cell.note}` : ''}
                      </div>
                      {cell.state === 'conflict' && (
                        <select
                          aria-label={`Circuit ${cell.circuitNumber} ${columnByKey[cell.column].label}: now ${cell.current}, file ${cell.incoming}`}
                          value={choices.byCell[key] ?? ''}
                          onChange={(e) => {
                            const value = e.currentTarget.value as 'keep' | 'take' | '';
                            const byCell = { ...choices.byCell };
                            if (value === '') delete byCell[key];
                            else byCell[key] = value;
                            setChoices({ ...choices, byCell });
                          }}
                          className={`rounded border px-1 text-xs ${choice === undefined ? 'border-error' : 'border-line-strong'}`}
                        >
                          <option value="">{choices.byColumn[cell.column] ? `as the column (${choices.byColumn[cell.column] === 'keep' ? 'keep' : 'take'})` : 'choose…'}</option>
                          <option value="keep">keep {cell.current}</option>
                          <option value="take">take {cell.incoming}</option>
                        </select>
                      )}
                      {findings.map((f, i) => (
                        <div key={i} className={`text-xs ${f.severity === 'error' ? 'text-error' : 'text-muted'}`}>
                          {f.severity}: {f.message}
                        </div>
                      ))}
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {unsettled > 0 && (
        <p role="alert" className="text-error">
          {unsettled} value{unsettled === 1 ? '' : 's'} still differ{unsettled === 1 ? 's' : ''} from the board: choose keep or take for each, or for the whole column.
        </p>
      )}
      {error && (
        <p role="alert" className="text-error">
          {error}
        </p>
      )}
      <div className="flex gap-2">
        <button type="button" onClick={onBack} className="rounded border border-line-strong px-3 py-1">
          Back to the mapping
        </button>
        <button type="submit" disabled={unsettled > 0 || writes.length === 0} className="rounded border border-line-strong bg-accent-soft px-3 py-1 font-medium">
          Import {writes.length} value{writes.length === 1 ? '' : 's'}
        </button>
      </div>
    </form>
  );
}
