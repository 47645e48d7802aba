// The one error type every API call rejects with: HTTP status plus the server's error code.
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: unknown;

  constructor(status: number, code: string, message: string, details?: unknown) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
  }
}

// Reads the `{ error: { code, message, details? } }` body; anything else becomes a code from the status.
export function apiErrorFrom(status: number, body: unknown): ApiError {
  if (body && typeof body === 'object' && 'error' in body) {
    const e = (body as { error: unknown }).error;
    if (e && typeof e === 'object' && typeof (e as { code?: unknown }).code === 'string') {
      const { code, message, details } = e as { code: string; message?: unknown; details?: unknown };
      return new ApiError(status, code, typeof message === 'string' ? message : '', details);
    }
  }
  return new ApiError(status, `http-${status}`, '');
}
