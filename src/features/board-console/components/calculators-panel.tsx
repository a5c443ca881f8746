import { useId, useState, type KeyboardEvent } from 'react';
import { expectedRadialR1PlusR2, maxCableLength, maxZs, tradeTemperatureFactors } from '../../../../shared/checker/index.ts';
import type { BoardDetail, Circuit } from '../../../../shared/schemas/boards.ts';

/** The calculators a tester reaches for beside the grid. */
export type CalculatorId = 'r1r2' | 'length' | 'max-zs' | 'zs-hot';

const calculators: ReadonlyArray<{ id: CalculatorId; label: string }> = [
  { id: 'r1r2', label: 'Expected R1+R2 from length and conductor sizes' },
  { id: 'length', label: 'Longest run a device and cable allow' },
  { id: 'max-zs', label: 'Maximum Zs for a device' },
  { id: 'zs-hot', label: 'Measured Zs corrected to the conductors’ operating temperature' },
];

/** A result in ohms (or metres) with where it comes from; `cellText` is what "put into the cell" writes. */
export interface CalculatorResult {
  words: string;
  source: string;
  /** The value for a reading cell (two decimals, Ω), when the result is one. */
  cellText: string | null;
}

export interface CalculatorInputs {
  lengthM: string;
  liveCsa: string;
  cpcCsa: string;
  standard: string;
  type: string;
  ratingA: string;
  timeS: string;
  zeOhm: string;
  zsOhm: string;
}

const num = (text: string): number => (text.trim() === '' ? Number.NaN : Number(text.trim()));
const ohm2 = (value: number) => value.toFixed(2);

/** Works out one calculator from the typed inputs: the answer with its source, or why not. */
export function calculate(id: CalculatorId, v: CalculatorInputs, u0: number): CalculatorResult | { error: string } {
  switch (id) {
    case 'r1r2': {
      const r = expectedRadialR1PlusR2({ lengthM: num(v.lengthM), liveCsaMm2: num(v.liveCsa), cpcCsaMm2: num(v.cpcCsa) });
      if (!r.ok) return { error: r.reason };
      const warm = r.ohm * tradeTemperatureFactors.thermoplastic70.factor;
      return {
        words: `R1+R2 ≈ ${ohm2(r.ohm)} Ω at 20 °C (${ohm2(warm)} Ω at 70 °C)`,
        source: `${r.source}; × ${tradeTemperatureFactors.thermoplastic70.factor} for 70 °C: ${tradeTemperatureFactors.thermoplastic70.source}`,
        cellText: ohm2(r.ohm),
      };
    }
    case 'length': {
      const r = maxCableLength({
        standard: v.standard,
        type: v.type,
        ratingA: num(v.ratingA),
        disconnectionTimeS: num(v.timeS),
        u0,
        zeOhm: num(v.zeOhm),
        liveCsaMm2: num(v.liveCsa),
        cpcCsaMm2: num(v.cpcCsa),
      });
      if (!r.ok) return { error: r.reason };
      return { words: `Longest run ≈ ${Math.floor(r.lengthM)} m (maximum Zs ${ohm2(r.maxZsOhm)} Ω)`, source: r.source, cellText: null };
    }
    case 'max-zs': {
      const r = maxZs({ standard: v.standard, type: v.type, ratingA: num(v.ratingA), disconnectionTimeS: num(v.timeS), u0 });
      if (!r.ok) return { error: r.reason };
      return { words: `Maximum Zs ${ohm2(r.limitOhm)} Ω for a ${r.device}; 0.8 × = ${ohm2(r.limitOhm * 0.8)} Ω to judge a measured value`, source: r.source, cellText: null };
    }
    case 'zs-hot': {
      const zs = num(v.zsOhm);
      const ze = num(v.zeOhm);
      if (!(zs > 0)) return { error: 'Give the measured Zs in ohms.' };
      if (!(ze >= 0)) return { error: 'Give Ze (or Zdb) in ohms.' };
      if (ze > zs) return { error: `Ze ${ze} Ω is above the measured Zs ${zs} Ω: the circuit's own R1+R2 cannot be negative.` };
      const factor = tradeTemperatureFactors.thermoplastic70.factor;
      const hot = ze + (zs - ze) * factor;
      return {
        words: `Zs at 70 °C ≈ ${ohm2(hot)} Ω (Ze ${ze} + (${zs} − ${ze}) × ${factor}); compare with the maximum Zs itself`,
        source: `the circuit's part of the loop (Zs − Ze) × ${factor}: ${tradeTemperatureFactors.thermoplastic70.source}`,
        cellText: null,
      };
    }
  }
}

function inputsFrom(circuit: Circuit | null, board: BoardDetail['board'], siteZe: number | null): CalculatorInputs {
  const text = (value: number | null | undefined) => (value === null || value === undefined ? '' : String(value));
  return {
    lengthM: text(circuit?.cableLengthM),
    liveCsa: text(circuit?.liveCsaMm2),
    cpcCsa: text(circuit?.cpcCsaMm2),
    standard: circuit?.deviceStandard ?? '',
    type: circuit?.deviceType ?? '',
    ratingA: text(circuit?.ratingA),
    timeS: text(circuit?.maxDisconnectionS ?? 0.4),
    zeOhm: text(board.zdbOhm ?? siteZe),
    zsOhm: circuit?.cells.zs?.text ?? '',
  };
}

export interface CalculatorsPanelProps {
  detail: BoardDetail;
  circuit: Circuit | null;
  /** The active cell's column label, for the "put into" button. */
  activeLabel: string | null;
  /** Writes the value into the active cell (through the grid, so it is saved and can be undone). */
  onPut: (text: string) => void;
  onClose: () => void;
}

/**
 * The calculators, filled from the active circuit and the board (Zdb, or the site's Ze): each answer
 * with its source. Alt+Enter (or the button) puts a result in ohms into the active cell; Esc closes.
 * A calculated value is no measurement: the panel says so beside the button.
 */
export function CalculatorsPanel({ detail, circuit, activeLabel, onPut, onClose }: CalculatorsPanelProps) {
  const [which, setWhich] = useState<CalculatorId>('r1r2');
  const [inputs, setInputs] = useState(() => inputsFrom(circuit, detail.board, detail.site.zeOhm));
  const id = useId();
  const result = calculate(which, inputs, detail.site.nominalVoltageV);
  const fields: Record<CalculatorId, Array<keyof CalculatorInputs>> = {
    r1r2: ['lengthM', 'liveCsa', 'cpcCsa'],
    length: ['standard', 'type', 'ratingA', 'timeS', 'zeOhm', 'liveCsa', 'cpcCsa'],
    'max-zs': ['standard', 'type', 'ratingA', 'timeS'],
    'zs-hot': ['zsOhm', 'zeOhm'],
  };
  const labels: Record<keyof CalculatorInputs, string> = {
    lengthM: 'Length (m)',
    liveCsa: 'Live (mm²)',
    cpcCsa: 'cpc (mm²)',
    standard: 'Device standard',
    type: 'Type',
    ratingA: 'In (A)',
    timeS: 'Disconnection time (s)',
    zeOhm: 'Ze or Zdb (Ω)',
    zsOhm: 'Measured Zs (Ω)',
  };
  const put = () => {
    if ('error' in result || result.cellText === null) return;
    onPut(result.cellText);
  };
  const onKeyDown = (event: KeyboardEvent<HTMLElement>) => {
    event.stopPropagation();
    if (event.key === 'Escape') {
      event.preventDefault();
      onClose();
    } else if (event.key === 'Enter' && event.altKey) {
      event.preventDefault();
      put();
    }
  };
  return (
    <section aria-label="Calculators" onKeyDown={onKeyDown} className="shrink-0 border-b border-line bg-paper px-3 py-2 text-sm">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col">
          <span className="text-xs text-muted">Calculator</span>
          <select autoFocus value={which} onChange={(e) => setWhich(e.target.value as CalculatorId)} className="rounded border border-line-strong px-1 py-0.5">
            {calculators.map((c) => (
              <option key={c.id} value={c.id}>
                {c.label}
              </option>
            ))}
          </select>
        </label>
        {fields[which].map((key) => (
          <label key={key} className="flex flex-col">
            <span className="text-xs text-muted">{labels[key]}</span>
            <input
              id={`${id}-${key}`}
              value={inputs[key]}
              onChange={(e) => setInputs((current) => ({ ...current, [key]: e.target.value }))}
              className="w-28 rounded border border-line-strong px-1.5 py-0.5"
            />
          </label>
        ))}
      </div>
      <p role="status" aria-live="polite" className="mt-1 font-medium">
        {'error' in result ? <span className="text-danger">{result.error}</span> : result.words}
      </p>
      {!('error' in result) && <p className="text-xs text-muted">Source: {result.source}</p>}
      <div className="mt-1 flex items-center gap-2">
        {!('error' in result) && result.cellText !== null && (
          <button type="button" onClick={put} className="rounded border border-accent px-2 py-0.5 text-accent">
            Put {result.cellText} into {activeLabel ?? 'the active cell'} (Alt+Enter)
          </button>
        )}
        <span className="text-xs text-muted">
          A calculated value is an expectation, not a measurement: record what the instrument reads. Esc closes.
        </span>
      </div>
    </section>
  );
}
