import { screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { User } from '../../../shared/schemas/auth.ts';
import { AppLayout } from '../../../src/app/app-layout.tsx';
import { RequireAuth } from '../../../src/app/require-auth.tsx';
import { authKeys } from '../../../src/features/auth/api/auth-keys.ts';
import { SignInPage } from '../../../src/features/auth/components/sign-in-page.tsx';
import { json, renderWithProviders, stubApi } from '../../helpers/render.tsx';

const ada: User = { id: 1, email: 'ada@example.test', name: 'Ada Admin', role: 'admin' };
const tess: User = { id: 2, email: 'tess@example.test', name: 'Tess Tester', role: 'tester' };

function renderLayout() {
  return renderWithProviders(
    <RequireAuth>
      <AppLayout />
    </RequireAuth>,
    { path: '/jobs', otherRoutes: { '/sign-in': <SignInPage /> } },
  );
}

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('app layout', () => {
  it('when an admin is signed in, then the header shows their name, role and the Admin link', async () => {
    stubApi({ 'GET /api/auth/me': () => json(200, { user: ada }) });
    renderLayout();

    const nav = await screen.findByRole('navigation', { name: 'Main' });
    expect(nav).toHaveTextContent('Jobs');
    expect(screen.getByRole('link', { name: 'Admin' })).toHaveAttribute('href', '/admin');
    expect(screen.getByText('Ada Admin')).toBeInTheDocument();
    expect(screen.getByText('admin')).toBeInTheDocument();
  });

  it('when a tester is signed in, then there is no Admin link', async () => {
    stubApi({ 'GET /api/auth/me': () => json(200, { user: tess }) });
    renderLayout();

    await screen.findByRole('navigation', { name: 'Main' });
    expect(screen.queryByRole('link', { name: 'Admin' })).not.toBeInTheDocument();
  });

  it('when Sign out is pressed, then the sign-in page shows and nothing of the person stays cached', async () => {
    const calls = stubApi({
      'GET /api/auth/me': () => json(200, { user: ada }),
      'POST /api/auth/sign-out': () => json(204, null),
    });
    const { user, queryClient, router, currentPath } = renderLayout();
    queryClient.setQueryData(['jobs', 'list', {}], []);

    await user.click(await screen.findByRole('button', { name: 'Sign out' }));

    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    expect(currentPath()).toBe('/sign-in');
    expect(calls.some((c) => c.method === 'POST' && c.path === '/api/auth/sign-out')).toBe(true);
    expect(queryClient.getQueryData(authKeys.me())).toBeNull();
    expect(queryClient.getQueryData(['jobs', 'list', {}])).toBeUndefined();
    // No "come back to" note: whoever signs in next starts at the jobs page.
    expect(router.state.location.state).toBeNull();
    expect(screen.queryByText(/You are signed in as/)).not.toBeInTheDocument();
  });
});
