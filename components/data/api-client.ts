// Fetch wrapper for /api: sends the session cookie, fetches the CSRF token once and sends it on
// every non-GET request, and retries once when the server says the token went stale.
import { ApiError, apiErrorFrom } from './api-error';

type FetchLike = (input: string, init?: RequestInit) => Promise<Response>;
type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export type ApiClient = {
  request<T>(method: Method, path: string, body?: unknown): Promise<T>;
  get<T>(path: string): Promise<T>;
  post<T>(path: string, body?: unknown): Promise<T>;
  patch<T>(path: string, body?: unknown): Promise<T>;
  del<T = void>(path: string): Promise<T>;
  // Multipart POST (file uploads): the browser sets the boundary, so no Content-Type is sent.
  upload<T>(path: string, form: FormData): Promise<T>;
  // The token is bound to the session: forget it when the session changes (sign-in, sign-out).
  forgetCsrfToken(): void;
};

export function createApiClient(options: { baseUrl?: string; fetch?: FetchLike } = {}): ApiClient {
  const baseUrl = options.baseUrl ?? '';
  const doFetch: FetchLike = options.fetch ?? ((input, init) => fetch(input, init));
  let csrf: Promise<string> | null = null;

  async function send(method: Method, path: string, init: RequestInit): Promise<Response> {
    try {
      return await doFetch(baseUrl + path, { ...init, method, credentials: 'include' });
    } catch {
      throw new ApiError(0, 'network', '');
    }
  }

  async function readBody(res: Response): Promise<unknown> {
    if (res.status === 204) return undefined;
    const text = await res.text();
    if (!text) return undefined;
    try {
      return JSON.parse(text);
    } catch {
      return text;
    }
  }

  function csrfToken(): Promise<string> {
    if (!csrf) {
      csrf = (async () => {
        const res = await send('GET', '/api/auth/csrf', { headers: { Accept: 'application/json' } });
        const body = await readBody(res);
        if (!res.ok) throw apiErrorFrom(res.status, body);
        const token = (body as { csrfToken?: unknown } | undefined)?.csrfToken;
        if (typeof token !== 'string') throw new ApiError(res.status, 'csrf', '');
        return token;
      })();
      // A failed fetch must not be cached, or every later write would fail the same way.
      csrf.catch(() => {
        csrf = null;
      });
    }
    return csrf;
  }

  async function attempt(method: Method, path: string, body: unknown): Promise<Response> {
    const headers: Record<string, string> = { Accept: 'application/json' };
    const form = typeof FormData !== 'undefined' && body instanceof FormData;
    if (body !== undefined && !form) headers['Content-Type'] = 'application/json';
    if (method !== 'GET') headers['X-CSRF-Token'] = await csrfToken();
    return send(method, path, { headers, body: body === undefined ? undefined : form ? (body as FormData) : JSON.stringify(body) });
  }

  async function request<T>(method: Method, path: string, body?: unknown): Promise<T> {
    let res = await attempt(method, path, body);
    let parsed = await readBody(res);
    if (method !== 'GET' && res.status === 403 && apiErrorFrom(res.status, parsed).code === 'csrf') {
      csrf = null;
      res = await attempt(method, path, body);
      parsed = await readBody(res);
    }
    if (!res.ok) throw apiErrorFrom(res.status, parsed);
    return parsed as T;
  }

  return {
    request,
    get: (path) => request('GET', path),
    post: (path, body) => request('POST', path, body),
    patch: (path, body) => request('PATCH', path, body),
    del: (path) => request('DELETE', path),
    upload: (path, form) => request('POST', path, form),
    forgetCsrfToken: () => {
      csrf = null;
    },
  };
}

// The app's single client: same origin as the page, because one server serves both.
export const api = createApiClient();
