// Proves the API client's CSRF handling (fetched once, sent on writes only, refreshed and retried
// exactly once on a stale-token refusal) and that error bodies become typed ApiErrors.
import { describe, expect, it } from 'vitest';
import { createApiClient } from './api-client';
import { ApiError } from './api-error';

type Call = { url: string; method: string; headers: Record<string, string>; body?: string; credentials?: string };

// A scripted server: each handler answers one request and records what it was sent.
function fakeServer(handler: (call: Call, calls: Call[]) => Response) {
  const calls: Call[] = [];
  const fetch = async (url: string, init?: RequestInit) => {
    const call: Call = {
      url,
      method: init?.method ?? 'GET',
      headers: (init?.headers ?? {}) as Record<string, string>,
      body: init?.body as string | undefined,
      credentials: init?.credentials,
    };
    calls.push(call);
    return handler(call, calls);
  };
  return { fetch, calls };
}

const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });

describe('createApiClient CSRF', () => {
  it('fetches the token once and sends it on every non-GET request, never on GET', async () => {
    let issued = 0;
    const server = fakeServer((call) => {
      if (call.url === '/api/auth/csrf') return json(200, { csrfToken: `tok-${++issued}` });
      return json(200, { ok: call.method });
    });
    const api = createApiClient({ fetch: server.fetch });
    await api.get('/api/team');
    await api.post('/api/team/invites', { email: 'a@b.test', role: 'viewer' });
    await api.patch('/api/account', { name: 'Ada' });
    await api.del('/api/team/invites/1');

    expect(issued).toBe(1);
    const get = server.calls.find((c) => c.url === '/api/team')!;
    expect(get.headers['X-CSRF-Token']).toBeUndefined();
    const writes = server.calls.filter((c) => c.method !== 'GET');
    expect(writes.map((c) => c.headers['X-CSRF-Token'])).toEqual(['tok-1', 'tok-1', 'tok-1']);
    expect(server.calls.every((c) => c.credentials === 'include')).toBe(true);
    expect(JSON.parse(writes[0].body!)).toEqual({ email: 'a@b.test', role: 'viewer' });
  });

  it('on a 403 csrf refusal fetches a fresh token and retries once', async () => {
    let issued = 0;
    const server = fakeServer((call) => {
      if (call.url === '/api/auth/csrf') return json(200, { csrfToken: `tok-${++issued}` });
      if (call.headers['X-CSRF-Token'] === 'tok-1') return json(403, { error: { code: 'csrf', message: 'CSRF token missing or wrong' } });
      return json(201, { id: 'inv-1' });
    });
    const api = createApiClient({ fetch: server.fetch });
    await expect(api.post('/api/team/invites', {})).resolves.toEqual({ id: 'inv-1' });
    const posts = server.calls.filter((c) => c.method === 'POST');
    expect(posts.map((c) => c.headers['X-CSRF-Token'])).toEqual(['tok-1', 'tok-2']);
  });

  it('gives up after one retry when the token is refused again', async () => {
    const server = fakeServer((call) => {
      if (call.url === '/api/auth/csrf') return json(200, { csrfToken: 'always-stale' });
      return json(403, { error: { code: 'csrf', message: 'CSRF token missing or wrong' } });
    });
    const api = createApiClient({ fetch: server.fetch });
    const error = await api.post('/api/auth/sign-out').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).code).toBe('csrf');
    expect(server.calls.filter((c) => c.method === 'POST')).toHaveLength(2);
  });

  it('does not retry a 403 that is a role refusal', async () => {
    const server = fakeServer((call) => {
      if (call.url === '/api/auth/csrf') return json(200, { csrfToken: 't' });
      return json(403, { error: { code: 'forbidden', message: 'Admins only' } });
    });
    const api = createApiClient({ fetch: server.fetch });
    await expect(api.post('/api/team/invites', {})).rejects.toMatchObject({ status: 403, code: 'forbidden' });
    expect(server.calls.filter((c) => c.method === 'POST')).toHaveLength(1);
  });

  it('fetches a new token after forgetCsrfToken (the session changed)', async () => {
    let issued = 0;
    const server = fakeServer((call) => (call.url === '/api/auth/csrf' ? json(200, { csrfToken: `tok-${++issued}` }) : new Response(null, { status: 204 })));
    const api = createApiClient({ fetch: server.fetch });
    await api.post('/api/auth/sign-out');
    api.forgetCsrfToken();
    await api.post('/api/auth/sign-out');
    expect(issued).toBe(2);
  });

  it('does not cache a failed token fetch', async () => {
    let attempts = 0;
    const server = fakeServer((call) => {
      if (call.url === '/api/auth/csrf') return ++attempts === 1 ? json(503, { error: { code: 'unavailable', message: 'down' } }) : json(200, { csrfToken: 'ok' });
      return json(200, {});
    });
    const api = createApiClient({ fetch: server.fetch });
    await expect(api.post('/api/account')).rejects.toMatchObject({ status: 503 });
    await expect(api.post('/api/account')).resolves.toEqual({});
  });
});

describe('createApiClient responses', () => {
  it('turns the error body into an ApiError with status, code, message and details', async () => {
    const details = [{ path: 'email', message: 'Invalid email address' }];
    const server = fakeServer(() => json(400, { error: { code: 'bad-request', message: 'email: Invalid email address', details } }));
    const error = (await createApiClient({ fetch: server.fetch }).get('/api/team').catch((e: unknown) => e)) as ApiError;
    expect(error).toBeInstanceOf(ApiError);
    expect([error.status, error.code, error.message]).toEqual([400, 'bad-request', 'email: Invalid email address']);
    expect(error.details).toEqual(details);
  });

  it('names a non-JSON failure by its status', async () => {
    const server = fakeServer(() => new Response('<html>Bad gateway</html>', { status: 502 }));
    await expect(createApiClient({ fetch: server.fetch }).get('/api/health')).rejects.toMatchObject({ status: 502, code: 'http-502' });
  });

  it('reports a network failure as status 0, code "network"', async () => {
    const api = createApiClient({
      fetch: async () => {
        throw new TypeError('Failed to fetch');
      },
    });
    await expect(api.get('/api/auth/me')).rejects.toMatchObject({ status: 0, code: 'network' });
  });

  it('resolves a 204 to undefined and prefixes the base URL', async () => {
    const server = fakeServer(() => new Response(null, { status: 204 }));
    const api = createApiClient({ fetch: server.fetch, baseUrl: 'http://127.0.0.1:8080' });
    await expect(api.get('/api/x')).resolves.toBeUndefined();
    expect(server.calls[0].url).toBe('http://127.0.0.1:8080/api/x');
  });
});

describe('createApiClient uploads', () => {
  it('sends a FormData body as-is with the CSRF token and no JSON content type', async () => {
    const server = fakeServer((call) => (call.url === '/api/auth/csrf' ? json(200, { csrfToken: 'tok' }) : json(201, { id: 'd-1' })));
    const api = createApiClient({ fetch: server.fetch });
    const form = new FormData();
    form.append('name', 'Wren-8 bus');
    await expect(api.upload('/api/designs', form)).resolves.toEqual({ id: 'd-1' });
    const post = server.calls.find((c) => c.method === 'POST')!;
    expect(post.headers['X-CSRF-Token']).toBe('tok');
    expect(post.headers['Content-Type']).toBeUndefined();
    expect(post.body as unknown).toBe(form);
  });
});
