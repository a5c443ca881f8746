import { screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { Company } from '../../../shared/schemas/company.ts';
import { CompanyPage } from '../../../src/features/admin/components/company-page.tsx';
import { json, renderWithProviders, stubApi, type ApiCall } from '../../helpers/render.tsx';

/** An invented company for the page. */
const saved: Company = {
  name: 'Kestrel Lane Electrical Ltd',
  address: '4 Kestrel Lane\nHarwick HW2 9QP',
  phone: '01632 960 418',
  email: 'office@kestrel-lane.example',
  registration: '',
  referencePattern: 'KL-{yyyy}-{seq:4}',
  logoFileId: null,
};

function stubCompanyApi(overrides: Partial<Record<string, (call: ApiCall) => Response>> = {}) {
  let company = { ...saved };
  return stubApi({
    'GET /api/company': () => json(200, { company }),
    'PUT /api/company': (call) => {
      company = { ...company, ...(call.body as object) };
      return json(200, { company });
    },
    'POST /api/company/logo': () => {
      company = { ...company, logoFileId: 7 };
      return json(201, { company });
    },
    'DELETE /api/company/logo': () => {
      company = { ...company, logoFileId: null };
      return json(200, { company });
    },
    ...overrides,
  });
}

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('company page', () => {
  it('when an admin changes the name and presses Enter, then every field is saved and the page says so', async () => {
    const calls = stubCompanyApi();
    const { user } = renderWithProviders(<CompanyPage />);
    const name = await screen.findByLabelText('Company name');
    expect(name).toHaveValue('Kestrel Lane Electrical Ltd');
    expect(screen.getByLabelText('Address')).toHaveValue('4 Kestrel Lane\nHarwick HW2 9QP');

    await user.clear(name);
    await user.type(name, 'Kestrel Lane Electrical{Enter}');

    expect(await screen.findByText('Saved. Documents issued from now on carry these details.')).toBeInTheDocument();
    expect(calls.find((c) => c.method === 'PUT')?.body).toEqual({
      name: 'Kestrel Lane Electrical',
      address: '4 Kestrel Lane\nHarwick HW2 9QP',
      phone: '01632 960 418',
      email: 'office@kestrel-lane.example',
      registration: '',
      referencePattern: 'KL-{yyyy}-{seq:4}',
    });
  });

  it('when Shift+Enter is typed in the address, then a new line starts and nothing is sent', async () => {
    const calls = stubCompanyApi();
    const { user } = renderWithProviders(<CompanyPage />);
    const address = await screen.findByLabelText('Address');
    await user.click(address);
    await user.keyboard('{Shift>}{Enter}{/Shift}Unit 2');
    expect(address).toHaveValue('4 Kestrel Lane\nHarwick HW2 9QP\nUnit 2');
    expect(calls.some((c) => c.method === 'PUT')).toBe(false);
  });

  it("when the server refuses the reference pattern, then its words show at that field, which gets the focus", async () => {
    stubCompanyApi({
      'PUT /api/company': () =>
        json(400, {
          error: {
            code: 'bad_request',
            message: 'The pattern needs {seq} (or {seq:4}) so every reference differs. (referencePattern)',
            issues: [{ path: 'referencePattern', message: 'The pattern needs {seq} (or {seq:4}) so every reference differs.' }],
          },
        }),
    });
    const { user } = renderWithProviders(<CompanyPage />);
    const pattern = await screen.findByLabelText('Job references');
    await user.clear(pattern);
    await user.type(pattern, 'KL-{yyyy}{Enter}');

    expect(await screen.findByText('The pattern needs {seq} (or {seq:4}) so every reference differs.')).toBeInTheDocument();
    expect(pattern).toHaveAttribute('aria-invalid', 'true');
    expect(pattern).toHaveFocus();
  });

  it('when a logo is chosen and uploaded, then the file goes as a form upload and the logo is shown', async () => {
    const calls = stubCompanyApi();
    const { user } = renderWithProviders(<CompanyPage />);
    expect(await screen.findByText(/No logo yet/)).toBeInTheDocument();

    const png = new File([new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])], 'kestrel.png', { type: 'image/png' });
    await user.upload(screen.getByLabelText('Logo file'), png);
    await user.click(screen.getByRole('button', { name: 'Upload logo' }));

    const logo = await screen.findByRole('img', { name: 'Logo of Kestrel Lane Electrical Ltd' });
    expect(logo).toHaveAttribute('src', '/api/files/7');
    const upload = calls.find((c) => c.method === 'POST');
    expect(upload?.form?.get('logo')).toBeInstanceOf(File);
    expect((upload?.form?.get('logo') as File).name).toBe('kestrel.png');
    expect(screen.getByText('Logo saved.')).toBeInTheDocument();
  });

  it('when the chosen logo is over 1 MB, then the page says so and sends nothing', async () => {
    const calls = stubCompanyApi();
    const { user } = renderWithProviders(<CompanyPage />);
    const input = await screen.findByLabelText('Logo file');
    const big = new File([new Uint8Array(1024 * 1024 + 1)], 'huge.png', { type: 'image/png' });
    await user.upload(input, big);
    await user.click(screen.getByRole('button', { name: 'Upload logo' }));

    expect(await screen.findByText(/The logo may be at most 1 MB; huge.png is 1.0 MB./)).toBeInTheDocument();
    expect(input).toHaveFocus();
    expect(calls.some((c) => c.method === 'POST')).toBe(false);
  });

  it("when the server refuses the file's content, then its reason shows at the logo field", async () => {
    stubCompanyApi({
      'POST /api/company/logo': () =>
        json(415, { error: { code: 'unsupported_type', message: 'The logo must be a PNG or JPEG image; its content is not a recognised file type, whatever its name says. Nothing was saved.' } }),
    });
    const { user } = renderWithProviders(<CompanyPage />);
    await user.upload(await screen.findByLabelText('Logo file'), new File(['just words'], 'fake.png', { type: 'image/png' }));
    await user.click(screen.getByRole('button', { name: 'Upload logo' }));

    expect(await screen.findByText(/must be a PNG or JPEG image/)).toBeInTheDocument();
    expect(screen.getByLabelText('Logo file')).toHaveAttribute('aria-invalid', 'true');
  });
});
