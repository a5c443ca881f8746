import { useUsers } from '../api/get-users.ts';
import { AccountSwitch } from './account-switch.tsx';
import { CreateUserForm } from './create-user-form.tsx';
import { PasswordReset } from './password-reset.tsx';
import { NameEditor } from './name-editor.tsx';
import { RoleChanger } from './role-changer.tsx';

/** Admins only: everyone with an account and their role, and a form to add someone. */
export function UsersPage() {
  const users = useUsers();

  return (
    <div className="mx-auto grid w-full max-w-6xl items-start gap-4 p-4 lg:grid-cols-[1fr_22rem]">
      <section aria-labelledby="people-heading" className="min-w-0 space-y-2">
        <h1 id="people-heading" className="text-lg font-semibold">
          People
        </h1>
        {users.isPending && <p className="text-muted">Loading people…</p>}
        {users.isError && (
          <div role="alert" className="space-y-2 rounded border border-danger bg-danger-soft px-3 py-2 text-danger">
            <p>The list of people could not be loaded: {users.error.message}</p>
            <button type="button" className="rounded border border-danger bg-surface px-2 py-0.5 font-medium" onClick={() => void users.refetch()}>
              Try again
            </button>
          </div>
        )}
        {users.isSuccess && (
          <table className="w-full border-collapse rounded border border-line bg-surface">
            <caption className="sr-only">People with an account, their roles and whether they can sign in</caption>
            <thead>
              <tr className="text-left text-xs text-muted">
                <th scope="col" className="px-3 py-1.5 font-medium">Name</th>
                <th scope="col" className="px-3 py-1.5 font-medium">E-mail</th>
                <th scope="col" className="px-3 py-1.5 font-medium">Role</th>
                <th scope="col" className="px-3 py-1.5 font-medium">Sign-in</th>
              </tr>
            </thead>
            <tbody>
              {users.data.map((user) => (
                <tr key={user.id} className="border-t border-line align-middle">
                  <th scope="row" className="px-3 py-1 text-left font-medium">
                    <NameEditor user={user} />
                  </th>
                  <td className="px-3 py-1 break-all">{user.email}</td>
                  <td className="px-3 py-1">
                    <RoleChanger user={user} />
                  </td>
                  <td className="space-y-1 px-3 py-1">
                    <AccountSwitch user={user} />
                    <PasswordReset user={user} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
      <CreateUserForm />
    </div>
  );
}
