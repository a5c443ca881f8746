import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseCell } from '../../../shared/checker/index.ts';
import { readingKeys } from '../../../shared/schemas/columns.ts';

describe('parseCell: what testers write', () => {
  it.each([
    ['zs', '0.44', { kind: 'number', value: 0.44 }],
    ['zs', '.44', { kind: 'number', value: 0.44 }],
    ['zs', ' 0.44 ', { kind: 'number', value: 0.44 }],
    ['zs', '0.44Ω', { kind: 'number', value: 0.44 }],
    ['zs', '0.44 ohm', { kind: 'number', value: 0.44 }],
    ['zs', '12.', { kind: 'number', value: 12 }],
    ['irLiveEarth', '>200', { kind: 'over-range', value: 200 }],
    ['irLiveEarth', '>999', { kind: 'over-range', value: 999 }],
    ['irLiveEarth', '≥ 500', { kind: 'over-range', value: 500 }],
    ['irLiveEarth', '>=299', { kind: 'over-range', value: 299 }],
    ['irLiveLive', '250 MΩ', { kind: 'number', value: 250 }],
    ['irTestVoltage', '250', { kind: 'number', value: 250 }],
    ['irTestVoltage', '500', { kind: 'number', value: 500 }],
    ['irTestVoltage', '1000 V', { kind: 'number', value: 1000 }],
    ['rcdTimeMs', '24', { kind: 'number', value: 24 }],
    ['rcdTimeMs', '24ms', { kind: 'number', value: 24 }],
    ['rcdTimeMs', '>300', { kind: 'over-range', value: 300 }],
    ['zs', '', { kind: 'empty' }],
    ['zs', '   ', { kind: 'empty' }],
    ['zs', 'N/A', { kind: 'na' }],
    ['zs', 'n/a', { kind: 'na' }],
    ['zs', 'na', { kind: 'na' }],
    ['polarity', 'N/A', { kind: 'na' }],
    ['zs', 'LIM', { kind: 'lim' }],
    ['zs', 'lim', { kind: 'lim' }],
    ['polarity', '✓', { kind: 'pass' }],
    ['polarity', '✔', { kind: 'pass' }],
    ['polarity', 'v', { kind: 'pass' }],
    ['polarity', 'y', { kind: 'pass' }],
    ['polarity', 'OK', { kind: 'pass' }],
    ['rcdButton', 'pass', { kind: 'pass' }],
    ['polarity', '✗', { kind: 'fail' }],
    ['polarity', '✘', { kind: 'fail' }],
    ['polarity', 'X', { kind: 'fail' }],
    ['afddButton', 'fail', { kind: 'fail' }],
  ] as const)('%s "%s" → %o (the trade\'s cell grammar, common practice)', (column, text, expected) => {
    expect(parseCell(column, text)).toEqual(expected);
  });

  it.each([
    ['zs', '0..44', 'format', 'did you mean 0.44'],
    ['zs', '4,4', 'comma', 'use a point, not a comma: 4.4'],
    ['irLiveEarth', '1,000', 'comma', 'thousands separator'],
    ['zs', '1.2.3', 'format', 'more than one point'],
    ['zs', '2500', 'range', '0–2000 ω'],
    ['ringR1', '25', 'range', '0–20 ω'],
    ['irLiveEarth', '2500', 'range', '0–2000 mω'],
    ['irLiveEarth', '>5000', 'range', '0–2000 mω'],
    ['rcdTimeMs', '2500', 'range', '0–2000 ms'],
    ['zs', '-0.1', 'range', 'cannot be negative'],
    // a lone dash (paper schedules' "not done") is answered with what to write — common practice
    ['zs', '-', 'format', 'write n/a if the test does not apply'],
    ['rcdTimeMs', '–', 'format', 'write n/a if the test does not apply'],
    ['polarity', '-', 'format', 'write n/a if the test does not apply'],
    ['irTestVoltage', '400', 'test-voltage', '250, 500 or 1000'],
    ['irTestVoltage', '>500', 'test-voltage', '250, 500 or 1000'],
    ['polarity', '1', 'wrong-kind', 'tick (✓) or a cross (✗)'],
    ['polarity', 'maybe', 'format', 'write ✓'],
    ['zs', '✓', 'wrong-kind', 'not a tick'],
    ['zs', 'x', 'wrong-kind', 'not a cross'],
    ['zs', 'abc', 'format', 'not a reading'],
    ['zs', '0.44 MΩ', 'format', 'unexpected "mω"'],
    ['zs', '<0.01', 'format', 'value the meter shows'],
    ['zs', '>', 'format', 'range after it'],
  ] as const)('%s "%s" is invalid (%s) with a clear message', (column, text, problem, words) => {
    const parsed = parseCell(column, text);
    expect(parsed.kind).toBe('invalid');
    if (parsed.kind === 'invalid') {
      expect(parsed.problem).toBe(problem);
      expect(parsed.message.toLowerCase()).toContain(words);
    }
  });

  it('reads an unknown column without a range', () => {
    expect(parseCell('bondingWater', '0.02')).toEqual({ kind: 'number', value: 0.02 });
    expect(parseCell('bondingWater', '✓')).toEqual({ kind: 'pass' });
  });

  it('never throws, whatever is typed into whichever column (property)', () => {
    const column = fc.oneof(fc.constantFrom(...readingKeys), fc.string());
    const text = fc.oneof(
      fc.string(),
      fc.string({ unit: fc.constantFrom('0', '1', '9', '.', ',', '>', '<', '≥', '-', ' ', 'e', 'Ω', '✓', 'x', 'N', '/', 'A', 'm', 's', 'V') }),
      fc.double().map(String),
    );
    fc.assert(
      fc.property(column, text, (c, t) => {
        const parsed = parseCell(c, t);
        expect(['empty', 'number', 'over-range', 'na', 'lim', 'pass', 'fail', 'invalid']).toContain(parsed.kind);
        if (parsed.kind === 'number' || parsed.kind === 'over-range') expect(Number.isFinite(parsed.value)).toBe(true);
      }),
      { numRuns: 3000 },
    );
  });
});
