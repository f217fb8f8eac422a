/**
 * The one error type services throw; route handlers turn it into `{error: {code, message, details}}`.
 * Status codes follow RFC 9110 §15: 400 malformed, 401 not signed in, 403 signed in but not allowed,
 * 404 absent (or hidden from this actor), 409 conflicting state, 413 content too large,
 * 405 method not allowed (with Allow), 415 unsupported media type, 422 well-formed but invalid content,
 * 429 too many requests, 503 the database is unreachable.
 */
export type ErrorCode =
  | 'bad_request'
  | 'validation_failed'
  | 'unauthenticated'
  | 'forbidden'
  | 'not_found'
  | 'method_not_allowed'
  | 'conflict'
  | 'too_large'
  | 'unsupported_media_type'
  | 'unprocessable'
  | 'rate_limited'
  | 'internal'
  | 'unavailable';

const STATUS: Record<ErrorCode, number> = {
  bad_request: 400,
  validation_failed: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  method_not_allowed: 405,
  conflict: 409,
  too_large: 413,
  unsupported_media_type: 415,
  unprocessable: 422,
  rate_limited: 429,
  internal: 500,
  unavailable: 503,
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

/**
 * True when an error means the database cannot be reached (connection refused or lost, pool timeout), so
 * the answer is 503 Service Unavailable rather than 500: the request may succeed later unchanged.
 */
export function isDatabaseDown(err: unknown): boolean {
  if (!err || typeof err !== 'object') return false;
  const e = err as { code?: unknown; name?: unknown; errno?: unknown; fatal?: unknown };
  if (e.name === 'KnexTimeoutError') return true;
  const code = typeof e.code === 'string' ? e.code : '';
  return ['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENOTFOUND', 'EPIPE', 'PROTOCOL_CONNECTION_LOST', 'ER_CON_COUNT_ERROR', 'ER_SERVER_SHUTDOWN', 'ER_ACCESS_DENIED_ERROR'].includes(code)
    || (e.fatal === true && code.startsWith('PROTOCOL_'));
}
