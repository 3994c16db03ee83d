// One error model: every error the API answers carries an HTTP status and a stable code.
import type { ErrorDetail } from '../shared/api/common';

export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details: ErrorDetail[] = [],
    readonly extra: Record<string, unknown> = {},
  ) {
    super(message);
  }
}

export class BadRequest extends AppError {
  constructor(message: string, details: ErrorDetail[] = [], code = 'invalid') {
    super(400, code, message, details);
  }
}
export class Unauthorized extends AppError {
  constructor(message = 'Sign in first.') {
    super(401, 'unauthorized', message);
  }
}
export class Forbidden extends AppError {
  constructor(message = 'Your role may not do this.', code = 'forbidden') {
    super(403, code, message);
  }
}
export class NotFound extends AppError {
  constructor(what = 'That record') {
    super(404, 'not_found', `${what} was not found.`);
  }
}
export class Conflict extends AppError {
  constructor(message: string, code = 'conflict', extra: Record<string, unknown> = {}) {
    super(409, code, message, [], extra);
  }
}
/** A part or unit asked for is no longer free: the caller lost a race or asked for too much. */
export class NotAvailable extends Conflict {
  constructor(message: string, extra: Record<string, unknown> = {}) {
    super(message, 'not_available', extra);
  }
}
export class PayloadTooLarge extends AppError {
  constructor(message = 'The upload is too large.') {
    super(413, 'too_large', message);
  }
}
export class UnsupportedMediaType extends AppError {
  constructor(message: string) {
    super(415, 'unsupported_type', message);
  }
}
export class TooManyRequests extends AppError {
  /** Sent as the Retry-After header, so a client knows when to try again. */
  constructor(
    message: string,
    readonly retryAfterSeconds?: number,
  ) {
    super(429, 'throttled', message);
  }
}
/** A service Stepstock relies on (the hosted payment service) refused or did not answer. */
export class BadGateway extends AppError {
  constructor(message: string, code = 'upstream_failed') {
    super(502, code, message);
  }
}
export class ServiceUnavailable extends AppError {
  constructor(
    message = 'The database cannot be reached just now. Try again in a moment.',
    readonly retryAfterSeconds = 2,
  ) {
    super(503, 'unavailable', message);
  }
}
