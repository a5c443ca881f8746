import { afterEach, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { apiRequest } from '../../src/lib/api-client.ts';

// The server refuses every change that is not application/json (server/middleware/same-origin.ts),
// so the one API client must say so on every request that is not GET, with or without a body.

function recordFetch() {
  const calls: { method: string; headers: Record<string, string>; body: unknown }[] = [];
  vi.stubGlobal('fetch', async (_url: string, init: RequestInit) => {
    calls.push({ method: String(init.method), headers: init.headers as Record<string, string>, body: init.body });
    return new Response(JSON.stringify({ ok: true }), { status: 200, headers: { 'content-type': 'application/json' } });
  });
  return calls;
}

afterEach(() => vi.unstubAllGlobals());

describe('apiRequest', () => {
  it.each(['POST', 'PUT', 'PATCH', 'DELETE'] as const)('when %s is sent without a body, then it says application/json and sends {}', async (method) => {
    const calls = recordFetch();
    await apiRequest(method, '/api/boards/1/lock', z.unknown());
    expect(calls[0]!.headers['content-type']).toBe('application/json');
    expect(calls[0]!.body).toBe('{}');
  });

  it('when a change has a body, then it is sent as JSON', async () => {
    const calls = recordFetch();
    await apiRequest('PUT', '/api/boards/1/circuits/2/cells/zs', z.unknown(), { text: '0.44', version: 0 });
    expect(calls[0]!.headers['content-type']).toBe('application/json');
    expect(calls[0]!.body).toBe('{"text":"0.44","version":0}');
  });

  it('when a GET is sent, then it has no body and no content type', async () => {
    const calls = recordFetch();
    await apiRequest('GET', '/api/auth/me', z.unknown());
    expect(calls[0]!.headers['content-type']).toBeUndefined();
    expect(calls[0]!.body).toBeUndefined();
  });

  it('when an upload sends FormData, then the browser sets its multipart type (no JSON type is forced)', async () => {
    const calls = recordFetch();
    const form = new FormData();
    form.append('file', new Blob(['x']), 'a.png');
    await apiRequest('POST', '/api/jobs/1/signatures', z.unknown(), form);
    expect(calls[0]!.headers['content-type']).toBeUndefined();
    expect(calls[0]!.body).toBe(form);
  });
});
