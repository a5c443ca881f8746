import { screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { RequireAuth } from '../../../src/app/require-auth.tsx';
import { RequireRole } from '../../../src/app/require-role.tsx';
import { createAppQueryClient } from '../../../src/app/query-client.ts';
import { useJobs } from '../../../src/features/jobs/api/get-jobs.ts';
import { SignInPage } from '../../../src/features/auth/components/sign-in-page.tsx';
import { json, renderWithProviders, stubApi } from '../../helpers/render.tsx';

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('route guards', () => {
  it('when nobody is signed in, then a protected page sends them to sign-in and back to it afterwards', async () => {
    let signedIn = false;
    const tess = { id: 2, email: 'tess@example.test', name: 'Tess Tester', role: 'tester' };
    stubApi({
      'GET /api/auth/me': () =>
        signedIn ? json(200, { user: tess }) : json(401, { error: { code: 'unauthenticated', message: 'Sign in first.' } }),
      'POST /api/auth/sign-in': () => {
        signedIn = true;
        return json(200, { user: tess });
      },
    });
    const { user, currentPath } = renderWithProviders(
      <RequireAuth>
        <p>Jobs list</p>
      </RequireAuth>,
      { path: '/jobs', initialEntries: ['/jobs?q=smith'], otherRoutes: { '/sign-in': <SignInPage /> } },
    );

    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    expect(currentPath()).toBe('/sign-in');

    await user.type(screen.getByLabelText('E-mail'), 'tess@example.test');
    await user.type(screen.getByLabelText('Password'), 'correct horse battery{Enter}');

    expect(await screen.findByText('Jobs list')).toBeInTheDocument();
    expect(currentPath()).toBe('/jobs?q=smith');
  });

  it('when the session ends while a page is open, then its next 401 sends the person to sign-in with a note to come back', async () => {
    stubApi({
      'GET /api/auth/me': () => json(200, { user: { id: 2, email: 'tess@example.test', name: 'Tess Tester', role: 'tester' } }),
      'GET /api/sites': () => json(401, { error: { code: 'unauthenticated', message: 'Sign in first.' } }),
      'GET /api/jobs': () => json(401, { error: { code: 'unauthenticated', message: 'Sign in first.' } }),
      'GET /api/boards': () => json(401, { error: { code: 'unauthenticated', message: 'Sign in first.' } }),
    });
    function JobsProbe() {
      const jobs = useJobs();
      return <p>{jobs.isError ? 'Jobs failed' : 'Jobs loading'}</p>;
    }
    const { router, currentPath } = renderWithProviders(
      <RequireAuth>
        <JobsProbe />
      </RequireAuth>,
      { path: '/jobs', otherRoutes: { '/sign-in': <SignInPage /> }, queryClient: createAppQueryClient() },
    );

    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    expect(currentPath()).toBe('/sign-in');
    expect(router.state.location.state).toMatchObject({ from: { pathname: '/jobs' } });
  });

  it('when a tester opens the admin page, then they read that only an admin can manage people', async () => {
    stubApi({ 'GET /api/auth/me': () => json(200, { user: { id: 2, email: 'tess@example.test', name: 'Tess Tester', role: 'tester' } }) });
    renderWithProviders(
      <RequireAuth>
        <RequireRole roles={['admin']} refusal="Only an admin can manage people.">
          <p>People list</p>
        </RequireRole>
      </RequireAuth>,
      { path: '/admin/users' },
    );

    expect(await screen.findByText('Only an admin can manage people.')).toBeInTheDocument();
    expect(screen.queryByText('People list')).not.toBeInTheDocument();
  });

  it('when an admin opens the admin page, then they see it', async () => {
    stubApi({ 'GET /api/auth/me': () => json(200, { user: { id: 1, email: 'ada@example.test', name: 'Ada Admin', role: 'admin' } }) });
    renderWithProviders(
      <RequireAuth>
        <RequireRole roles={['admin']} refusal="Only an admin can manage people.">
          <p>People list</p>
        </RequireRole>
      </RequireAuth>,
      { path: '/admin/users' },
    );

    expect(await screen.findByText('People list')).toBeInTheDocument();
  });
});
