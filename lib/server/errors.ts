/**
 * The one error type services throw; route handlers turn it into `{error: {code, message, details}}`.
 * Status codes follow RFC 9110 §15: 400 malformed, 401 not signed in, 403 signed in but not allowed,
 * 404 absent (or hidden from this actor), 409 conflicting state, 413 content too large,
 * 415 unsupported media type, 422 well-formed but invalid content, 429 too many requests.
 */
export type ErrorCode =
  | 'bad_request'
  | 'validation_failed'
  | 'unauthenticated'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'too_large'
  | 'unsupported_media_type'
  | 'unprocessable'
  | 'rate_limited'
  | 'internal';

const STATUS: Record<ErrorCode, number> = {
  bad_request: 400,
  validation_failed: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  too_large: 413,
  unsupported_media_type: 415,
  unprocessable: 422,
  rate_limited: 429,
  internal: 500,
};

export class ApiError extends Error {
  readonly code: ErrorCode;
  readonly status: number;
  readonly details: unknown;
  constructor(code: ErrorCode, message: string, details: unknown = null) {
    super(message);
    this.name = 'ApiError';
    this.code = code;
    this.status = STATUS[code];
    this.details = details;
  }
}

export const notFound = (what = 'project') => new ApiError('not_found', `No such ${what}, or you cannot see it.`);
