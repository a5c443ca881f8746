import { screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { calculate, type CalculatorInputs } from '../../../../src/features/board-console/components/calculators-panel.tsx';
import { activeCell, boardDetail, cellOf, circuit, renderConsole } from './console-fixture.tsx';

const inputs = (over: Partial<CalculatorInputs>): CalculatorInputs => ({
  lengthM: '',
  liveCsa: '2.5',
  cpcCsa: '1.5',
  standard: '60898',
  type: 'B',
  ratingA: '32',
  timeS: '0.4',
  zeOhm: '0.35',
  zsOhm: '',
  ...over,
});

describe('calculate', () => {
  it('expected R1+R2: 20 m of 2.5/1.5 is 20 × (7.41 + 12.1) mΩ = 0.39 Ω at 20 °C (IEC 60228 Table 2)', () => {
    const r = calculate('r1r2', inputs({ lengthM: '20' }), 230);
    expect(r).toMatchObject({ cellText: '0.39' });
    if (!('error' in r)) expect(r.source).toMatch(/IEC 60228/);
  });

  it('maximum Zs: B32 at 0.4 s is 1.37 Ω (BS 7671:2018 Table 41.3)', () => {
    const r = calculate('max-zs', inputs({}), 230);
    expect(r).toMatchObject({ words: expect.stringContaining('Maximum Zs 1.37 Ω') });
    if (!('error' in r)) expect(r.source).toMatch(/41\.3/);
  });

  it('longest run: B32, Ze 0.35 Ω, 2.5/1.5 at 70 °C is (1.37 − 0.35) / (19.51 mΩ/m × 1.20) = 43.6 m, given as 43 m (formula; 1.20 from IET Guidance Note 3 [memory])', () => {
    expect(calculate('length', inputs({}), 230)).toMatchObject({ words: expect.stringContaining('Longest run ≈ 43 m') });
  });

  it('Zs when hot: Ze 0.35, measured 0.80 → 0.35 + 0.45 × 1.20 = 0.89 Ω (factor from IET Guidance Note 3 [memory])', () => {
    expect(calculate('zs-hot', inputs({ zsOhm: '0.80' }), 230)).toMatchObject({ words: expect.stringContaining('0.89 Ω') });
    expect(calculate('zs-hot', inputs({ zsOhm: '0.20' }), 230)).toMatchObject({ error: expect.stringContaining('above the measured Zs') });
  });
});

describe('the calculators in the console', () => {
  it('when opened on a radial with its length, then the expected R1+R2 shows with its source and Alt+Enter puts it into the active cell', async () => {
    const { grid, user, calls } = renderConsole(boardDetail([circuit(61, '1', {}, { kind: 'radial', cableLengthM: 20, ratingA: 20 })]));
    await user.click(cellOf(grid, '1', 'R1+R2'));
    await user.keyboard('{Alt>}{Shift>}C{/Shift}{/Alt}');
    const panel = await screen.findByRole('region', { name: 'Calculators' });
    expect(panel).toHaveTextContent('R1+R2 ≈ 0.39 Ω at 20 °C');
    expect(panel).toHaveTextContent('Source:');
    await user.keyboard('{Alt>}{Enter}{/Alt}');
    await waitFor(() => expect(screen.queryByRole('region', { name: 'Calculators' })).toBeNull());
    expect(calls).toEqual([{ kind: 'cell', circuitId: 61, column: 'r1PlusR2', text: '0.39', reason: null, how: 'typed' }]);
    expect(activeCell(grid)).toBe(cellOf(grid, '1', 'R1+R2'));
    expect(screen.getByRole('status')).toHaveTextContent('(calculated)');
  });
});
