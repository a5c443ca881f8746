import { NavLink, Outlet } from 'react-router-dom';

const tabClass = ({ isActive }: { isActive: boolean }) =>
  `rounded px-2 py-1 font-medium ${isActive ? 'bg-accent-soft text-accent' : 'text-ink hover:bg-accent-soft'}`;

/** The admin pages under one small menu: people, the company's details, the local mailbox. */
export function AdminLayout() {
  return (
    <div className="flex flex-col">
      <nav aria-label="Admin" className="mx-auto flex w-full max-w-6xl gap-1 px-4 pt-3">
        <NavLink to="/admin/users" className={tabClass}>
          People
        </NavLink>
        <NavLink to="/admin/company" className={tabClass}>
          Company
        </NavLink>
        <NavLink to="/admin/mailbox" className={tabClass}>
          Mailbox
        </NavLink>
      </nav>
      <Outlet />
    </div>
  );
}
