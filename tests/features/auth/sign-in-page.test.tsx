import { screen } from '@testing-library/react';
import type { InitialEntry } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { SignInPage } from '../../../src/features/auth/components/sign-in-page.tsx';
import { json, renderWithProviders, stubApi } from '../../helpers/render.tsx';

const ada = { id: 1, email: 'ada@example.test', name: 'Ada Admin', role: 'admin' };
const signedOut = () => json(401, { error: { code: 'unauthenticated', message: 'Sign in first.' } });

function renderSignIn(initialEntries: InitialEntry[] = ['/sign-in']) {
  return renderWithProviders(<SignInPage />, {
    path: '/sign-in',
    initialEntries,
    otherRoutes: { '/jobs': <p>Jobs list</p>, '/boards/:boardId': <p>Board console</p> },
  });
}

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('sign-in page', () => {
  it('when the page opens, then the e-mail field has the cursor and the safety caution is shown', async () => {
    stubApi({ 'GET /api/auth/me': signedOut });
    renderSignIn();
    expect(screen.getByLabelText('E-mail')).toHaveFocus();
    expect(screen.getByText(/Testing is for competent people after safe isolation/)).toBeInTheDocument();
    expect(screen.getByText(/does not replace the inspector's judgement/)).toBeInTheDocument();
  });

  it("when the server refuses the password, then the server's message shows beside the form and the page stays", async () => {
    const calls = stubApi({
      'GET /api/auth/me': signedOut,
      'POST /api/auth/sign-in': () =>
        json(401, { error: { code: 'unauthenticated', message: 'That e-mail and password do not match an account.' } }),
    });
    const { user, currentPath } = renderSignIn();

    await user.type(screen.getByLabelText('E-mail'), 'ada@example.test');
    await user.type(screen.getByLabelText('Password'), 'not the password{Enter}');

    expect(await screen.findByRole('alert')).toHaveTextContent('That e-mail and password do not match an account.');
    expect(currentPath()).toBe('/sign-in');
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({ email: 'ada@example.test', password: 'not the password' });
    // The password is selected for retyping.
    expect(screen.getByLabelText('Password')).toHaveFocus();
  });

  it('when the server rejects the e-mail, then its message shows at the e-mail field', async () => {
    stubApi({
      'GET /api/auth/me': signedOut,
      'POST /api/auth/sign-in': () =>
        json(400, {
          error: {
            code: 'bad_request',
            message: 'Enter an e-mail address such as name@example.com. (email)',
            issues: [{ path: 'email', message: 'Enter an e-mail address such as name@example.com.' }],
          },
        }),
    });
    const { user } = renderSignIn();

    await user.type(screen.getByLabelText('E-mail'), 'ada');
    await user.type(screen.getByLabelText('Password'), 'whatever{Enter}');

    const email = screen.getByLabelText('E-mail');
    expect(await screen.findByRole('alert')).toHaveTextContent('Enter an e-mail address such as name@example.com.');
    expect(email).toHaveAttribute('aria-invalid', 'true');
    expect(email).toHaveAccessibleDescription('Enter an e-mail address such as name@example.com.');
  });

  it('when the sign-in succeeds, then the person lands on the jobs page', async () => {
    stubApi({ 'GET /api/auth/me': signedOut, 'POST /api/auth/sign-in': () => json(200, { user: ada }) });
    const { user, currentPath } = renderSignIn();

    await user.type(screen.getByLabelText('E-mail'), 'ada@example.test');
    await user.type(screen.getByLabelText('Password'), 'correct horse battery{Enter}');

    expect(await screen.findByText('Jobs list')).toBeInTheDocument();
    expect(currentPath()).toBe('/jobs');
  });

  it('when the sign-in succeeds after being sent away from a board, then the person is back on that board', async () => {
    stubApi({ 'GET /api/auth/me': signedOut, 'POST /api/auth/sign-in': () => json(200, { user: ada }) });
    const { user, currentPath } = renderSignIn([{ pathname: '/sign-in', state: { from: { pathname: '/boards/7', search: '?circuit=3' } } }]);

    await user.type(screen.getByLabelText('E-mail'), 'ada@example.test');
    await user.type(screen.getByLabelText('Password'), 'correct horse battery{Enter}');

    expect(await screen.findByText('Board console')).toBeInTheDocument();
    expect(currentPath()).toBe('/boards/7?circuit=3');
  });
});
