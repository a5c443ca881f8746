/**
 * Properties of checkBoard over random boards: the same board always gives the same findings, the
 * order of its circuits does not matter, and the caching checker agrees with the plain one.
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkBoard, createBoardChecker } from '../../../shared/checker/index.ts';
import type { CheckCircuit, CheckInput } from '../../../shared/schemas/check.ts';
import { circuitKinds, rcdTypes, readingKeys } from '../../../shared/schemas/columns.ts';

const cellText = fc.oneof(
  fc.constantFrom('', '0.44', '.44', '0.3', '1.2', '>200', '>999', '500', '250', '1000', 'N/A', 'LIM', '✓', '✗', '24', '320', '0..44', '4,4', '0.85', '0.52'),
  fc.double({ min: 0, max: 3, noNaN: true }).map((v) => v.toFixed(2)),
  fc.string({ maxLength: 6 }),
);

const cells = fc.dictionary(
  fc.constantFrom(...readingKeys),
  fc.record({ text: cellText, reason: fc.option(fc.constantFrom('no access', '', 'freezer'), { nil: null }) }),
);

function circuitArbitrary(id: number, ids: readonly number[]): fc.Arbitrary<CheckCircuit> {
  return fc.record({
    id: fc.constant(id),
    number: fc.constantFrom('1', '2', '3', '4', '5', '7', '3L1'),
    phase: fc.constantFrom(null, 'L1' as const, 'L2' as const),
    description: fc.constant('circuit'),
    kind: fc.constantFrom(...circuitKinds),
    wiringType: fc.constant('A'),
    referenceMethod: fc.constant('C'),
    points: fc.option(fc.integer({ min: 0, max: 12 }), { nil: null }),
    liveCsaMm2: fc.constantFrom(null, 1, 1.5, 2.5, 4, 6, 0.75),
    cpcCsaMm2: fc.constantFrom(null, 1, 1.5, 2.5),
    maxDisconnectionS: fc.constantFrom(null, 0.2, 0.4, 1, 5),
    deviceStandard: fc.constantFrom('', '60898', 'BS EN 61009', '88-2', '88-3', '3036', '1362', 'other'),
    deviceType: fc.constantFrom('', 'B', 'C', 'D', 'gG'),
    ratingA: fc.constantFrom(null, 3, 6, 13, 16, 20, 32, 45, 63, 100),
    breakingKa: fc.constantFrom(null, 3, 6, 10),
    rcdType: fc.constantFrom(null, ...rcdTypes),
    rcdRatedResidualMa: fc.constantFrom(null, 30, 100, 300),
    afdd: fc.constantFrom(null, 'yes' as const, 'no' as const),
    remarks: fc.constant(''),
    spurRingId: fc.option(fc.constantFrom(...ids, 999), { nil: null }),
    spurOriginPoint: fc.constantFrom(null, 'socket 3', '0.5', '40%', 'kitchen'),
    spurLengthM: fc.constantFrom(null, 3, 8),
    maxZsByHandOhm: fc.constantFrom(null, 0.5, 2.4),
    cableLengthM: fc.constantFrom(undefined, null, 12, 40),
    cells,
  });
}

const boardArbitrary: fc.Arbitrary<CheckInput> = fc
  .uniqueArray(fc.integer({ min: 1, max: 60 }), { minLength: 0, maxLength: 14 })
  .chain((ids) =>
    fc.record({
      board: fc.record({
        phases: fc.constantFrom(1 as const, 3 as const),
        zdbOhm: fc.constantFrom(null, 0, 0.2, 0.35, 0.8, 150),
        ipfKa: fc.constantFrom(null, 0.05, 1.6, 8),
        polarityConfirmed: fc.boolean(),
      }),
      site: fc.record({ earthing: fc.constantFrom('TN-S' as const, 'TN-C-S' as const, 'TT' as const), nominalVoltageV: fc.constantFrom(110, 230, 240, 277, 480) }),
      circuits: fc.tuple(...ids.map((id) => circuitArbitrary(id, ids))),
    }),
  );

describe('checkBoard properties', () => {
  it('is deterministic and independent of the order of the circuits', () => {
    fc.assert(
      fc.property(boardArbitrary, fc.infiniteStream(fc.nat()), (input, randomness) => {
        const first = checkBoard(input);
        expect(checkBoard(structuredClone(input))).toEqual(first);
        const shuffled = [...input.circuits];
        for (let i = shuffled.length - 1; i > 0; i--) {
          const j = randomness.next().value % (i + 1);
          [shuffled[i], shuffled[j]] = [shuffled[j]!, shuffled[i]!];
        }
        expect(checkBoard({ ...input, circuits: shuffled })).toEqual(first);
      }),
      { numRuns: 300 },
    );
  }, 30_000);

  it('never throws, and every finding is well formed', () => {
    fc.assert(
      fc.property(boardArbitrary, (input) => {
        for (const f of checkBoard(input)) {
          expect(['error', 'warning', 'note', 'todo']).toContain(f.severity);
          expect(f.code).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/);
          expect(f.message.length).toBeGreaterThan(0);
        }
      }),
      { numRuns: 300 },
    );
  }, 30_000);

  it('the caching checker gives the same findings as checkBoard, before and after an edit', () => {
    fc.assert(
      fc.property(boardArbitrary, fc.nat(), cellText, fc.constantFrom(...readingKeys), (input, pick, text, key) => {
        const check = createBoardChecker();
        expect(check(input)).toEqual(checkBoard(input));
        if (input.circuits.length === 0) return;
        const index = pick % input.circuits.length;
        const edited = input.circuits.map((c, i) => (i === index ? { ...c, cells: { ...c.cells, [key]: { text, reason: null } } } : c));
        const after = { ...input, circuits: edited };
        expect(check(after)).toEqual(checkBoard(after));
        const zdbChanged = { ...after, board: { ...after.board, zdbOhm: 0.5 } };
        expect(check(zdbChanged)).toEqual(checkBoard(zdbChanged));
      }),
      { numRuns: 200 },
    );
  }, 30_000);
});
