import { screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { boardDetail, circuit, renderConsole } from './console-fixture.tsx';

function jsonResponse(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
}

const detail = () => boardDetail([circuit(51, '1', {}, { kind: 'radial' })]);

afterEach(() => vi.unstubAllGlobals());

describe('the board’s details in the console header', () => {
  it('when Zdb is typed with its unit and Enter pressed, then only Zdb is sent with the board version, and the form closes saying so', async () => {
    const fetchMock = vi.fn(async () => jsonResponse(200, { board: { ...detail().board, zdbOhm: 0.31, version: 2 } }));
    vi.stubGlobal('fetch', fetchMock);
    const { user } = renderConsole(detail());
    await user.keyboard('{Alt>}{Shift>}B{/Shift}{/Alt}');
    const zdb = await screen.findByLabelText('Zdb (Ω)');
    expect(zdb).toHaveFocus();
    await user.clear(zdb);
    await user.type(zdb, '0.31 Ω{Enter}');
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(1));
    const [url, init] = fetchMock.mock.calls[0] as unknown as [string, RequestInit];
    expect(url).toBe('/api/boards/1');
    expect(init.method).toBe('PATCH');
    expect(JSON.parse(String(init.body))).toEqual({ version: 1, changes: { zdbOhm: 0.31 } });
    await waitFor(() => expect(screen.queryByRole('form', { name: 'Board details' })).toBeNull());
    expect(screen.getByRole('status')).toHaveTextContent('Board details saved.');
  });

  it('when someone else changed the details meanwhile, then their values fill the form and it says so; a bad number shows at its field', async () => {
    const theirs = { ...detail().board, zdbOhm: 0.4, instruments: 'MFT serial 7731, calibrated 2026-06-01', version: 3 };
    const fetchMock = vi.fn(async () => jsonResponse(409, { error: { code: 'conflict', message: 'Someone changed this board’s details meanwhile; look again and retry.', details: { current: theirs } } }));
    vi.stubGlobal('fetch', fetchMock);
    const { user } = renderConsole(detail());
    await user.keyboard('{Alt>}{Shift>}B{/Shift}{/Alt}');
    const ipf = await screen.findByLabelText('Ipf (kA)');
    await user.clear(ipf);
    await user.type(ipf, 'lots{Enter}');
    expect(fetchMock).not.toHaveBeenCalled();
    expect(screen.getByLabelText('Ipf (kA)')).toHaveAttribute('aria-invalid', 'true');
    expect(screen.getByText(/Ipf must be/)).toBeDefined();
    await user.clear(ipf);
    await user.type(ipf, '2.1{Enter}');
    await waitFor(() => expect(screen.getByRole('alert')).toHaveTextContent('Someone changed this board’s details meanwhile'));
    expect(screen.getByLabelText('Zdb (Ω)')).toHaveValue('0.4');
    expect(screen.getByLabelText('Instruments (serial, calibration date)')).toHaveValue('MFT serial 7731, calibrated 2026-06-01');
  });
});
