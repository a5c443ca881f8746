import { screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { JobSignatures, Signature } from '../../../shared/schemas/signatures.ts';
import { SigningPanel } from '../../../src/features/signing/components/signing-panel.tsx';
import { json, renderWithProviders, stubApi, type ApiCall } from '../../helpers/render.tsx';

const signature = (changes: Partial<Signature>): Signature => ({
  id: 1,
  jobId: 5,
  role: 'inspector',
  name: 'Tom Tester',
  fileId: 21,
  signedBy: { id: 3, name: 'Tom Tester' },
  signedAt: '2026-11-30T09:00:00.000Z',
  current: true,
  revision: 1,
  ...changes,
});

function stubSigningApi(initial: JobSignatures, onSign?: (call: ApiCall) => Response) {
  let data = initial;
  return stubApi({
    'GET /api/jobs/5/signatures': () => json(200, data),
    'POST /api/jobs/5/signatures': (call) => {
      if (onSign) return onSign(call);
      const made = signature({
        id: 9,
        role: call.form!.get('role') as Signature['role'],
        name: String(call.form!.get('name')),
        fileId: 30,
        signedBy: { id: 2, name: 'Rhea Reviewer' },
      });
      data = { ...data, signatures: [made, ...data.signatures.map((s) => (s.role === made.role ? { ...s, current: false } : s))] };
      return json(201, { signature: made });
    },
  });
}

const eicr = (changes: Partial<JobSignatures> = {}): JobSignatures => ({
  signatures: [signature({})],
  jobKind: 'EICR',
  jobState: 'ready',
  roles: ['inspector', 'reviewer'],
  revision: 1,
  reopened: null,
  ...changes,
});

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('signing panel', () => {
  it('when a reviewer signs with a chosen image, then role, typed name and file go as a form upload and the new signature shows', async () => {
    const calls = stubSigningApi(eicr());
    const { user } = renderWithProviders(<SigningPanel jobId={5} person={{ role: 'reviewer', name: 'Rhea Reviewer' }} />);

    const inUse = await screen.findByRole('list', { name: 'Signatures in use' });
    expect(within(inUse).getByRole('img', { name: 'Signature of Tom Tester' })).toHaveAttribute('src', '/api/files/21');
    expect(within(inUse).getByText('Not signed yet.')).toBeInTheDocument();
    expect(screen.getByLabelText('Sign as')).toHaveValue('reviewer');
    expect(screen.getByLabelText('Name')).toHaveValue('Rhea Reviewer');

    await user.click(screen.getByLabelText('Choose an image file'));
    const png = new File([new Uint8Array([0x89, 0x50, 0x4e, 0x47])], 'rhea.png', { type: 'image/png' });
    await user.upload(screen.getByLabelText(/Signature image/), png);
    await user.click(screen.getByRole('button', { name: 'Sign as reviewer' }));

    expect(await screen.findByText('Signed as reviewer by Rhea Reviewer.')).toBeInTheDocument();
    const form = calls.find((c) => c.method === 'POST')!.form!;
    expect(form.get('role')).toBe('reviewer');
    expect(form.get('name')).toBe('Rhea Reviewer');
    expect((form.get('image') as File).name).toBe('rhea.png');
    expect(await within(inUse).findByRole('img', { name: 'Signature of Rhea Reviewer' })).toHaveAttribute('src', '/api/files/30');
  });

  it('when a tester picks the reviewer, then the panel says only a reviewer or an admin signs there and sends nothing', async () => {
    const calls = stubSigningApi(eicr());
    const { user } = renderWithProviders(<SigningPanel jobId={5} person={{ role: 'tester', name: 'Tom Tester' }} />);
    const role = await screen.findByLabelText('Sign as');
    expect(role).toHaveValue('inspector');
    await user.selectOptions(role, 'reviewer');
    expect(screen.getByText('Only a reviewer or an admin can sign as the reviewer; you are signed in as a tester.')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Sign as reviewer' }));
    expect(calls.some((c) => c.method === 'POST')).toBe(false);
  });

  it('when nothing is drawn, then the box is named as what is missing and nothing is sent', async () => {
    const calls = stubSigningApi(eicr({ signatures: [] }));
    const { user } = renderWithProviders(<SigningPanel jobId={5} person={{ role: 'tester', name: 'Tom Tester' }} />);
    await user.click(await screen.findByRole('button', { name: 'Sign as inspector' }));
    expect(screen.getByText('Sign in the box first (mouse, pen or finger), or choose an image file instead.')).toBeInTheDocument();
    expect(screen.getByRole('img', { name: /Signature box/ })).toHaveFocus();
    expect(calls.some((c) => c.method === 'POST')).toBe(false);
  });

  it('when the server refuses the image by its content, then its words show at the signature', async () => {
    stubSigningApi(eicr({ signatures: [] }), () =>
      json(415, { error: { code: 'unsupported_type', message: 'A signature image must be a PNG or JPEG image; its content is not a recognised file type, whatever its name says. Nothing was saved.' } }),
    );
    const { user } = renderWithProviders(<SigningPanel jobId={5} person={{ role: 'tester', name: 'Tom Tester' }} />);
    await user.click(await screen.findByLabelText('Choose an image file'));
    await user.upload(screen.getByLabelText(/Signature image/), new File(['words'], 'fake.png', { type: 'image/png' }));
    await user.click(screen.getByRole('button', { name: 'Sign as inspector' }));
    expect(await screen.findByText(/must be a PNG or JPEG image/)).toBeInTheDocument();
    expect(screen.getByLabelText(/Signature image/)).toHaveAttribute('aria-invalid', 'true');
  });

  it('when the job was reopened after issue, then no signature is in use, the earlier ones are listed as revision 1’s and the panel says why everyone signs again', async () => {
    stubSigningApi(
      eicr({
        jobState: 'entering',
        revision: 2,
        reopened: { at: '2026-12-02T08:00:00.000Z', by: { id: 2, name: 'Rhea Reviewer' }, reason: 'Wrong meter position', revision: 1 },
        signatures: [signature({ id: 2, role: 'reviewer', name: 'Rhea Reviewer', current: false }), signature({ current: false })],
      }),
    );
    renderWithProviders(<SigningPanel jobId={5} person={{ role: 'tester', name: 'Tom Tester' }} />);
    const inUse = await screen.findByRole('list', { name: 'Signatures in use' });
    expect(within(inUse).getAllByText('Not signed yet.')).toHaveLength(2);
    expect(screen.getByText(/Rhea Reviewer reopened revision 1 on .*Wrong meter position.*Everyone signs again for revision 2/)).toBeInTheDocument();
    expect(screen.getByText(/inspector \(inspection and testing\): Tom Tester, .*given for revision 1/)).toBeInTheDocument();
  });

  it('when the job is issued, then no form shows, only why', async () => {
    stubSigningApi(eicr({ jobState: 'issued' }));
    renderWithProviders(<SigningPanel jobId={5} person={{ role: 'reviewer', name: 'Rhea Reviewer' }} />);
    expect(await screen.findByText('This job is issued and frozen; a reviewer must reopen it before anyone signs again.')).toBeInTheDocument();
    expect(screen.queryByRole('form', { name: 'Sign this job' })).not.toBeInTheDocument();
  });
});
