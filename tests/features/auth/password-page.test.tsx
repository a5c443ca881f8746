import { screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { PasswordPage } from '../../../src/features/auth/components/password-page.tsx';
import { json, renderWithProviders, stubApi } from '../../helpers/render.tsx';

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('password page', () => {
  it('when the person types both passwords and presses Enter, then the change is sent and they are told their other sign-ins ended', async () => {
    const calls = stubApi({ 'POST /api/auth/password': () => new Response(null, { status: 204 }) });
    const { user } = renderWithProviders(<PasswordPage />);
    await user.type(screen.getByLabelText('Current password'), 'old long password');
    await user.type(screen.getByLabelText('New password'), 'a new long password{Enter}');
    expect(await screen.findByText('Your password is changed. Your other sign-ins have ended.')).toBeInTheDocument();
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({ currentPassword: 'old long password', newPassword: 'a new long password' });
    expect(screen.getByLabelText('Current password')).toHaveValue('');
  });

  it('when the current password is wrong, then the server’s message shows at that field and it gets the focus', async () => {
    stubApi({
      'POST /api/auth/password': () =>
        json(400, { error: { code: 'bad_request', message: 'The current password is not right; nothing was changed.', details: { field: 'currentPassword' } } }),
    });
    const { user } = renderWithProviders(<PasswordPage />);
    await user.type(screen.getByLabelText('Current password'), 'not it');
    await user.type(screen.getByLabelText('New password'), 'a new long password{Enter}');
    const current = screen.getByLabelText('Current password');
    expect(await screen.findByText('The current password is not right; nothing was changed.')).toBeInTheDocument();
    expect(current).toHaveAttribute('aria-invalid', 'true');
    expect(current).toHaveFocus();
  });

  it('when the new password is too short, then the message shows at the new password', async () => {
    stubApi({
      'POST /api/auth/password': () =>
        json(400, { error: { code: 'bad_request', message: 'A password needs at least 10 characters. (newPassword)', issues: [{ path: 'newPassword', message: 'A password needs at least 10 characters.' }] } }),
    });
    const { user } = renderWithProviders(<PasswordPage />);
    await user.type(screen.getByLabelText('Current password'), 'old long password');
    await user.type(screen.getByLabelText('New password'), 'short{Enter}');
    expect(await screen.findByText('A password needs at least 10 characters.')).toBeInTheDocument();
    expect(screen.getByLabelText('New password')).toHaveAccessibleDescription('A password needs at least 10 characters.');
  });
});
