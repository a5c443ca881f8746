import { Navigate, RouterProvider, createBrowserRouter, type RouteObject } from 'react-router-dom';
import { SignInPage } from '../features/auth/components/sign-in-page.tsx';
import { AdminLayout } from './admin-layout.tsx';
import { AppLayout } from './app-layout.tsx';
import { FullPageMessage } from './full-page-message.tsx';
import { NotFoundPage } from './not-found-page.tsx';
import { RequireAuth } from './require-auth.tsx';
import { RequireRole } from './require-role.tsx';
import { RouteErrorPage } from './route-error-page.tsx';

/**
 * Every route of the app. Signed-out people reach only /sign-in; the rest sits behind RequireAuth
 * inside the app layout. Each page behind sign-in is its own chunk, loaded when first opened: the
 * sign-in page loads only itself and the frame, the jobs list does not load the board console (the
 * largest part of the client: grid, palette, checker, sync engine) nor the job screen, and only
 * admins load the admin pages.
 */
export const appRoutes: RouteObject[] = [
  {
    errorElement: <RouteErrorPage />,
    hydrateFallbackElement: (
      <div className="flex h-dvh flex-col">
        <FullPageMessage title="Opening Boardwalk…" />
      </div>
    ),
    children: [
      { path: '/sign-in', element: <SignInPage /> },
      {
        element: (
          <RequireAuth>
            <AppLayout />
          </RequireAuth>
        ),
        children: [
          { index: true, element: <Navigate to="/jobs" replace /> },
          {
            path: 'jobs',
            lazy: async () => {
              const { JobsPage } = await import('../features/jobs/components/jobs-page.tsx');
              return { Component: JobsPage };
            },
          },
          {
            path: 'boards/:boardId',
            lazy: async () => {
              const { BoardConsolePage } = await import('../features/board-console/components/board-console-page.tsx');
              return { Component: BoardConsolePage };
            },
          },
          {
            path: 'jobs/:jobId',
            lazy: async () => {
              const { JobRoute } = await import('./job-route.tsx');
              return { Component: JobRoute };
            },
          },
          {
            path: 'account/password',
            lazy: async () => {
              const { PasswordPage } = await import('../features/auth/components/password-page.tsx');
              return { Component: PasswordPage };
            },
          },
          {
            path: 'review',
            lazy: async () => {
              const { ReviewQueueRoute } = await import('./review-routes.tsx');
              return { Component: ReviewQueueRoute };
            },
          },
          {
            path: 'review/:jobId',
            lazy: async () => {
              const { ReviewJobRoute } = await import('./review-routes.tsx');
              return { Component: ReviewJobRoute };
            },
          },
          {
            path: 'admin',
            element: (
              <RequireRole roles={['admin']} refusal="Only an admin can manage people, the company's details and the mailbox.">
                <AdminLayout />
              </RequireRole>
            ),
            children: [
              { index: true, element: <Navigate to="/admin/users" replace /> },
              {
                path: 'users',
                lazy: async () => {
                  const { UsersPage } = await import('../features/admin/components/users-page.tsx');
                  return { Component: UsersPage };
                },
              },
              {
                path: 'company',
                lazy: async () => {
                  const { CompanyPage } = await import('../features/admin/components/company-page.tsx');
                  return { Component: CompanyPage };
                },
              },
              {
                path: 'mailbox',
                lazy: async () => {
                  const { MailboxPage } = await import('../features/mail/components/mailbox-page.tsx');
                  return { Component: MailboxPage };
                },
              },
            ],
          },
          { path: '*', element: <NotFoundPage /> },
        ],
      },
    ],
  },
];

const router = createBrowserRouter(appRoutes);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
