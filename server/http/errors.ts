// Typed HTTP errors that services throw; the one error handler turns them into the error body.
import type { ErrorCode } from '@/shared/api/error';

export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

export class BadRequest extends HttpError {
  constructor(message = 'The request is not valid.', details?: unknown, code: ErrorCode = 'bad-request') {
    super(400, code, message, details);
  }
}

export class Unauthorized extends HttpError {
  constructor(message = 'Sign in to continue.', code: ErrorCode = 'unauthorized') {
    super(401, code, message);
  }
}

export class Forbidden extends HttpError {
  constructor(message = 'Your role does not allow this.', code: ErrorCode = 'forbidden') {
    super(403, code, message);
  }
}

export class NotFound extends HttpError {
  constructor(message = 'Not found.') {
    super(404, 'not-found', message);
  }
}

export class Conflict extends HttpError {
  constructor(message: string, code: ErrorCode = 'conflict', details?: unknown) {
    super(409, code, message, details);
  }
}

export class TooManyRequests extends HttpError {
  constructor(message = 'Too many attempts. Wait a few minutes and try again.') {
    super(429, 'rate-limited', message);
  }
}
