import { screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { ListedUser as User } from '../../../shared/schemas/auth.ts';
import { UsersPage } from '../../../src/features/admin/components/users-page.tsx';
import { json, renderWithProviders, stubApi, type ApiCall } from '../../helpers/render.tsx';

const ada: User = { id: 1, email: 'ada@example.test', name: 'Ada Admin', role: 'admin', active: true, deactivatedAt: null };
const tess: User = { id: 2, email: 'tess@example.test', name: 'Tess Tester', role: 'tester', active: true, deactivatedAt: null };

/** A fake users API over an in-memory list; `createAnswer` overrides the POST's answer. */
function stubUsersApi(createAnswer?: (call: ApiCall) => Response) {
  const people = [ada, tess];
  return stubApi({
    'GET /api/users': () => json(200, { users: people }),
    'POST /api/users': (call) => {
      if (createAnswer) return createAnswer(call);
      const body = call.body as Omit<User, 'id'> & { password: string };
      const user: User = { id: people.length + 1, email: body.email, name: body.name, role: body.role, active: true, deactivatedAt: null };
      people.push(user);
      return json(201, { user });
    },
    'PATCH /api/users/2': (call) => {
      const changes = call.body as Partial<User>;
      people[1] = { ...people[1]!, ...changes };
      if (changes.active !== undefined) people[1].deactivatedAt = changes.active ? null : '2026-12-02T08:00:00.000Z';
      return json(200, { user: people[1] });
    },
    'PATCH /api/users/1': () =>
      json(409, { error: { code: 'conflict', message: 'This is the last admin; make someone else an admin first.' } }),
  });
}

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('users page', () => {
  it('when an admin edits a name and presses Enter, then only the name is sent and the row shows it', async () => {
    const calls = stubUsersApi();
    const { user } = renderWithProviders(<UsersPage />);
    const field = await screen.findByRole('textbox', { name: 'Name of Tess Tester' });
    await user.clear(field);
    await user.type(field, 'Tess Trent{Enter}');
    expect(await screen.findByText('Saved as Tess Trent.')).toBeInTheDocument();
    expect(calls.filter((c) => c.method === 'PATCH').map((c) => c.body)).toEqual([{ name: 'Tess Trent' }]);
  });

  it('when a name is emptied, then nothing is sent and the reason shows', async () => {
    const calls = stubUsersApi();
    const { user } = renderWithProviders(<UsersPage />);
    const field = await screen.findByRole('textbox', { name: 'Name of Tess Tester' });
    await user.clear(field);
    await user.type(field, '{Enter}');
    expect(screen.getByText('A name cannot be empty.')).toHaveAttribute('role', 'alert');
    expect(calls.filter((c) => c.method === 'PATCH')).toHaveLength(0);
  });

  it('when an admin deactivates a person from the keyboard, then it asks once, sends active: false and offers to reactivate', async () => {
    const calls = stubUsersApi();
    const { user } = renderWithProviders(<UsersPage />);
    const row = (await screen.findByRole('rowheader', { name: 'Tess Tester' })).closest('tr')!;
    within(row).getByRole('button', { name: 'Deactivate…' }).focus();
    await user.keyboard('{Enter}');
    const confirm = within(row).getByRole('button', { name: 'Deactivate Tess Tester' });
    expect(confirm).toHaveFocus();
    expect(calls.filter((c) => c.method === 'PATCH')).toHaveLength(0);
    await user.keyboard('{Enter}');
    expect(await within(row).findByText('Tess Tester is signed out and cannot sign in.')).toBeInTheDocument();
    expect(calls.find((c) => c.method === 'PATCH')?.body).toEqual({ active: false });
    expect(within(row).getByText('Deactivated')).toBeInTheDocument();
    await user.click(within(row).getByRole('button', { name: 'Reactivate' }));
    expect(await within(row).findByText('Tess Tester can sign in again.')).toBeInTheDocument();
    expect(calls.filter((c) => c.method === 'PATCH').map((c) => c.body)).toEqual([{ active: false }, { active: true }]);
  });

  it('when an admin sets a new password from the keyboard, then it is sent and the row says the person was signed out everywhere', async () => {
    const calls = stubUsersApi();
    const { user } = renderWithProviders(<UsersPage />);
    const row = (await screen.findByRole('rowheader', { name: 'Tess Tester' })).closest('tr')!;
    within(row).getByRole('button', { name: 'New password…' }).focus();
    await user.keyboard('{Enter}');
    expect(within(row).getByLabelText('New password for Tess Tester')).toHaveFocus();
    await user.keyboard('a fresh long secret{Enter}');
    expect(await within(row).findByText('New password set; Tess Tester was signed out everywhere.')).toBeInTheDocument();
    expect(calls.find((c) => c.method === 'PATCH')?.body).toEqual({ password: 'a fresh long secret' });
  });

  it('when the admin keeps the person active, then nothing is sent', async () => {
    const calls = stubUsersApi();
    const { user } = renderWithProviders(<UsersPage />);
    const row = (await screen.findByRole('rowheader', { name: 'Tess Tester' })).closest('tr')!;
    await user.click(within(row).getByRole('button', { name: 'Deactivate…' }));
    await user.click(within(row).getByRole('button', { name: 'Keep active' }));
    expect(within(row).getByRole('button', { name: 'Deactivate…' })).toBeInTheDocument();
    expect(calls.filter((c) => c.method === 'PATCH')).toHaveLength(0);
  });

  it('when an admin fills in the form and presses Enter, then the person is created and listed', async () => {
    const calls = stubUsersApi();
    const { user } = renderWithProviders(<UsersPage />);
    await screen.findByRole('rowheader', { name: 'Ada Admin' });

    await user.type(screen.getByLabelText('E-mail'), 'rhea@example.test');
    await user.type(screen.getByLabelText('Name'), 'Rhea Reviewer');
    await user.selectOptions(screen.getByLabelText('Role'), 'reviewer');
    await user.type(screen.getByLabelText('Password'), 'a long enough secret{Enter}');

    expect(await screen.findByRole('rowheader', { name: 'Rhea Reviewer' })).toBeInTheDocument();
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({
      email: 'rhea@example.test',
      name: 'Rhea Reviewer',
      role: 'reviewer',
      password: 'a long enough secret',
    });
    expect(screen.getByText('Rhea Reviewer can now sign in as rhea@example.test (reviewer).')).toBeInTheDocument();
    // The form is empty and ready for the next person.
    expect(screen.getByLabelText('E-mail')).toHaveValue('');
    expect(screen.getByLabelText('E-mail')).toHaveFocus();
  });

  it("when the server rejects the password, then its message shows at the password field", async () => {
    stubUsersApi(() =>
      json(400, {
        error: {
          code: 'bad_request',
          message: 'A password needs at least 10 characters. (password)',
          issues: [{ path: 'password', message: 'A password needs at least 10 characters.' }],
        },
      }),
    );
    const { user } = renderWithProviders(<UsersPage />);
    await screen.findByRole('rowheader', { name: 'Ada Admin' });

    await user.type(screen.getByLabelText('E-mail'), 'rhea@example.test');
    await user.type(screen.getByLabelText('Name'), 'Rhea Reviewer');
    await user.type(screen.getByLabelText('Password'), 'short{Enter}');

    const password = screen.getByLabelText('Password');
    expect(await screen.findByText('A password needs at least 10 characters.')).toBeInTheDocument();
    expect(password).toHaveAttribute('aria-invalid', 'true');
    expect(password).toHaveAccessibleDescription('A password needs at least 10 characters.');
    expect(password).toHaveFocus();
    expect(screen.queryByRole('rowheader', { name: 'Rhea Reviewer' })).not.toBeInTheDocument();
  });

  it('when the e-mail already has an account, then the conflict shows at the e-mail field', async () => {
    stubUsersApi(() => json(409, { error: { code: 'conflict', message: 'There is already an account for tess@example.test.' } }));
    const { user } = renderWithProviders(<UsersPage />);
    await screen.findByRole('rowheader', { name: 'Ada Admin' });

    await user.type(screen.getByLabelText('E-mail'), 'tess@example.test');
    await user.type(screen.getByLabelText('Name'), 'Tess Again');
    await user.type(screen.getByLabelText('Password'), 'a long enough secret{Enter}');

    expect(await screen.findByText('There is already an account for tess@example.test.')).toBeInTheDocument();
    expect(screen.getByLabelText('E-mail')).toHaveAccessibleDescription('There is already an account for tess@example.test.');
  });

  it('when a role is chosen and Change role pressed, then the new role is saved and shown', async () => {
    const calls = stubUsersApi();
    const { user } = renderWithProviders(<UsersPage />);
    const row = (await screen.findByRole('rowheader', { name: 'Tess Tester' })).closest('tr')!;

    await user.selectOptions(within(row).getByLabelText('Role of Tess Tester'), 'reviewer');
    expect(calls.some((c) => c.method === 'PATCH')).toBe(false);
    await user.click(within(row).getByRole('button', { name: 'Change role' }));

    expect(await within(row).findByText('Now reviewer.')).toBeInTheDocument();
    expect(calls.find((c) => c.method === 'PATCH')).toMatchObject({ path: '/api/users/2', body: { role: 'reviewer' } });
    expect(within(row).getByLabelText('Role of Tess Tester')).toHaveValue('reviewer');
    expect(within(row).queryByRole('button', { name: 'Change role' })).not.toBeInTheDocument();
  });

  it('when the server refuses a role change, then its reason shows in that row', async () => {
    stubUsersApi();
    const { user } = renderWithProviders(<UsersPage />);
    const row = (await screen.findByRole('rowheader', { name: 'Ada Admin' })).closest('tr')!;

    await user.selectOptions(within(row).getByLabelText('Role of Ada Admin'), 'tester');
    await user.click(within(row).getByRole('button', { name: 'Change role' }));

    expect(await within(row).findByRole('alert')).toHaveTextContent('This is the last admin; make someone else an admin first.');
    expect(within(row).getByLabelText('Role of Ada Admin')).toHaveAttribute('aria-invalid', 'true');
  });
});
