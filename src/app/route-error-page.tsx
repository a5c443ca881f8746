import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { FullPageMessage } from './full-page-message.tsx';

/** What the router shows when a page throws while rendering or its code fails to load. */
export function RouteErrorPage() {
  const error = useRouteError();
  const detail = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : 'An unexpected error.';
  return (
    <div className="flex h-dvh flex-col">
      <FullPageMessage title="This page stopped working">
        <p className="text-muted">{detail}</p>
        <p>Readings already shown as saved are kept on the server. Reloading usually puts things right.</p>
        <button
          type="button"
          className="rounded border border-line-strong bg-surface px-3 py-1 font-medium hover:bg-accent-soft"
          onClick={() => window.location.reload()}
        >
          Reload
        </button>
      </FullPageMessage>
    </div>
  );
}
