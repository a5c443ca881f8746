import { describe, expect, it } from 'vitest';
import { cleanReading } from '../../../shared/readings/clean-reading.ts';
import type { ReadingKey } from '../../../shared/schemas/columns.ts';

// Units of the schedule's columns: Ω for continuity and loop impedance, MΩ for insulation
// resistance, ms for RCD times, V for the insulation test voltage (BS 7671:2018 Appendix 6 model
// schedule of test results; Table 64 for the test voltages).
describe('cleanReading: what a typed, pasted or dictated reading becomes before it is saved', () => {
  const kept: Array<[ReadingKey, string, string, RegExp | null]> = [
    ['zs', '0.44Ω', '0.44', /unit “Ω”/],
    ['zs', '0.44 ohm', '0.44', /unit “ohm”/],
    ['zs', '.44 ohms', '0.44', /unit/],
    ['irLiveEarth', '200 MΩ', '200', /unit “MΩ”/],
    ['irLiveEarth', '>200 MΩ', '>200', /unit/],
    ['irLiveEarth', '>999', '>999', null],
    ['rcdTimeMs', '24ms', '24', /unit “ms”/],
    ['irTestVoltage', '500 V', '500', /unit “V”/],
    // Dictation: "7 zs .44, ir >200" leaves a comma after the value.
    ['zs', '.44,', '0.44', /“,”/],
    ['polarity', 'v', '✓', null],
    ['zs', 'na', 'N/A', null],
    ['zs', 'lim', 'LIM', null],
    // A value outside the plausible range is still a value: saved, and the checker reports it.
    ['zs', '2500', '2500', null],
    ['irTestVoltage', '400', '400', null],
    ['zs', '', '', null],
  ];
  it.each(kept)('when %s gets "%s", then "%s" is saved', (column, typed, saved, note) => {
    const result = cleanReading(column, typed);
    expect(result).toMatchObject({ ok: true, text: saved });
    if (result.ok) {
      if (note) expect(result.stripped).toMatch(note);
      else expect(result.stripped).toBeNull();
    }
  });

  const refused: Array<[ReadingKey, string, RegExp]> = [
    ['zs', '-', /dash is not a reading/],
    ['zs', '—', /dash/],
    ['zs', '24 ms', /Zs is in Ω, not ms/],
    ['rcdTimeMs', '0.44 Ω', /in ms, not Ω/],
    ['zs', '0,44', /point, not a comma/],
    ['zs', 'abc', /not a reading/],
    ['polarity', '0.5', /tick/],
    ['zs', 'ok', /not a tick/],
    ['zs', '0.44 kg', /unexpected "kg"/],
  ];
  it.each(refused)('when %s gets "%s", then it is refused in words', (column, typed, message) => {
    const result = cleanReading(column, typed);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.message).toMatch(message);
  });
});
