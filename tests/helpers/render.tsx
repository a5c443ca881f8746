import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { ReactElement } from 'react';
import { RouterProvider, createMemoryRouter, type InitialEntry, type RouteObject } from 'react-router-dom';
import { vi } from 'vitest';

/** A QueryClient for one test: nothing shared, no retries, so an error answer shows at once. */
export function createTestQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: { queries: { retry: false, staleTime: Infinity }, mutations: { retry: false } },
  });
}

export interface RenderOptions {
  /** Where the router starts (paths, or entries with state). Defaults to `[path]` or "/". */
  initialEntries?: InitialEntry[];
  /** The route pattern the element under test is mounted at; defaults to "*". */
  path?: string;
  /** Other pages by route pattern, e.g. where a navigation should land. */
  otherRoutes?: Record<string, ReactElement>;
  queryClient?: QueryClient;
}

/**
 * Renders `ui` inside a fresh QueryClient and an in-memory router. The router is a data router
 * (`createMemoryRouter`), like the app's `createBrowserRouter`, so `useNavigation` and navigation
 * options such as `flushSync` behave as they do in the browser. Returns testing-library's result
 * plus a user-event instance, the client, the router, and `currentPath()` (path and query).
 */
export function renderWithProviders(ui: ReactElement, options: RenderOptions = {}) {
  const path = options.path ?? '*';
  const queryClient = options.queryClient ?? createTestQueryClient();
  const initialEntries = options.initialEntries ?? [path.includes(':') || path === '*' ? '/' : path];
  const routes: RouteObject[] = [
    { path, element: ui },
    ...Object.entries(options.otherRoutes ?? {}).map(([pattern, element]) => ({ path: pattern, element })),
  ];
  const router = createMemoryRouter(routes, { initialEntries });
  const result = render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return {
    ...result,
    user: userEvent.setup(),
    queryClient,
    router,
    currentPath: () => `${router.state.location.pathname}${router.state.location.search}`,
  };
}

/** A JSON answer as the API sends it. */
export function json(status: number, body: unknown): Response {
  return new Response(status === 204 ? null : JSON.stringify(body), {
    status,
    headers: { 'content-type': 'application/json' },
  });
}

/** A request the fake API received, with its JSON body parsed. */
export interface ApiCall {
  method: string;
  path: string;
  search: string;
  body: unknown;
  /** A multipart body (an upload) as sent, when the request carried one. */
  form?: FormData;
}

type Handler = (call: ApiCall) => Response | Promise<Response>;

/**
 * Replaces `fetch` with a small fake API: handlers keyed by "METHOD /path" (no query string).
 * A request no handler takes answers 404 in the API's error shape, so a test fails loudly rather
 * than hanging. Returns the list of calls received. Undo with `vi.unstubAllGlobals()`.
 */
export function stubApi(handlers: Record<string, Handler>): ApiCall[] {
  const calls: ApiCall[] = [];
  vi.stubGlobal('fetch', async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = new URL(typeof input === 'string' ? input : input instanceof URL ? input.href : input.url, 'http://localhost');
    const method = (init.method ?? 'GET').toUpperCase();
    const body = typeof init.body === 'string' ? (JSON.parse(init.body) as unknown) : undefined;
    const form = init.body instanceof FormData ? init.body : undefined;
    const call: ApiCall = { method, path: url.pathname, search: url.search, body, ...(form ? { form } : {}) };
    calls.push(call);
    const handler = handlers[`${method} ${url.pathname}`];
    if (!handler) return json(404, { error: { code: 'not_found', message: `No fake for ${method} ${url.pathname}.` } });
    return handler(call);
  });
  return calls;
}
