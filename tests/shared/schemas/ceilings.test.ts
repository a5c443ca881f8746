/**
 * Plausible-range ceilings of the schemas and the cell grammar, checked against TT systems: the earth
 * electrode is in the loop, so loop impedances of hundreds of ohms are normal there. A 30 mA RCD
 * allows Zs up to 50 V / 30 mA = 1667 Ω (BS 7671:2018 411.5.3 and Table 41.5 [from memory]).
 */
import { describe, expect, it } from 'vitest';
import { parseCell } from '../../../shared/checker/index.ts';
import { circuitFieldsSchema, updateBoardBodySchema } from '../../../shared/schemas/boards.ts';

describe('ceilings that must hold a TT loop impedance', () => {
  it('when Zs is 350 Ω or 1667 Ω, then the Zs cell reads it as a number (TT, 50 V / 30 mA = 1667 Ω)', () => {
    expect(parseCell('zs', '350')).toEqual({ kind: 'number', value: 350 });
    expect(parseCell('zs', '1667')).toEqual({ kind: 'number', value: 1667 });
    expect(parseCell('zs', '>1999')).toEqual({ kind: 'over-range', value: 1999 });
  });

  it('when a board on TT has Zdb 180 Ω, then the board update accepts it', () => {
    expect(updateBoardBodySchema.safeParse({ version: 1, changes: { zdbOhm: 180 } }).success).toBe(true);
    expect(updateBoardBodySchema.safeParse({ version: 1, changes: { zdbOhm: 2500 } }).success).toBe(false);
  });

  it('when a maximum Zs of 1667 Ω is given by hand, then the circuit fields accept it', () => {
    const partial = circuitFieldsSchema.partial();
    expect(partial.safeParse({ maxZsByHandOhm: 1667 }).success).toBe(true);
    expect(partial.safeParse({ cableLengthM: 42.5 }).success).toBe(true);
    expect(partial.safeParse({ cableLengthM: -1 }).success).toBe(false);
  });
});
