import { describe, expect, it } from 'vitest';
import type { ColumnKey } from '../../../../shared/schemas/columns.ts';
import { enterStopsAt, type CircuitForStops } from '../../../../src/features/board-console/grid/enter-stops.ts';

const radial: CircuitForStops = { kind: 'radial', rcdType: null, afdd: 'no', cells: {} };
const ringWithRcdAndAfdd: CircuitForStops = { kind: 'ring', rcdType: 'A', afdd: 'yes', cells: {} };

describe('where Enter stops (the checker’s required readings, details, and any value)', () => {
  it.each<[string, CircuitForStops, ColumnKey, boolean]>([
    ['ring r1 on a radial is passed', radial, 'ringR1', false],
    ['ring rn on a radial is passed', radial, 'ringRn', false],
    ['R1+R2 applies to a radial', radial, 'r1PlusR2', true],
    ['R2 by long lead is passed (R1+R2 is the reading required)', radial, 'r2', false],
    ['Zs applies to a radial', radial, 'zs', true],
    ['RCD time without an RCD is passed', radial, 'rcdTimeMs', false],
    ['RCD button without an RCD is passed', radial, 'rcdButton', false],
    ['AFDD button without an AFDD is passed', radial, 'afddButton', false],
    ['a detail column is never passed', radial, 'rcdType', true],
    ['ring r2 applies to a ring', ringWithRcdAndAfdd, 'ringR2', true],
    ['RCD time applies with an RCD', ringWithRcdAndAfdd, 'rcdTimeMs', true],
    ['AFDD button applies with an AFDD', ringWithRcdAndAfdd, 'afddButton', true],
    ['a distribution circuit needs no ring readings', { ...radial, kind: 'distribution' }, 'ringR1', false],
  ])('%s', (_name, circuit, column, stops) => {
    expect(enterStopsAt(circuit, column)).toBe(stops);
  });

  it('when a reading that does not apply holds a value, then Enter stops there so it can be corrected', () => {
    expect(enterStopsAt({ ...radial, cells: { rcdTimeMs: { text: 'N/A' } } }, 'rcdTimeMs')).toBe(true);
    expect(enterStopsAt({ ...radial, cells: { ringR1: { text: '' } } }, 'ringR1')).toBe(false);
  });
});
