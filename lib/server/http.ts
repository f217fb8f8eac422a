/**
 * Thin helpers for route handlers: resolve the actor, parse with zod, call a service, shape the
 * response. Every failure leaves as `{error: {code, message, details}}`.
 *
 * Cross-site request forgery: a state-changing request that carries a session cookie (and no API
 * token) must come from our own pages — an `Origin` equal to the site's, or `Sec-Fetch-Site:
 * same-origin` when a browser sends no Origin — and its body must be JSON or multipart. HTML forms can
 * only send urlencoded, multipart or text/plain bodies, and fetch() from another origin cannot send
 * JSON without a CORS preflight we never grant, so together with SameSite=Lax cookies this closes
 * the ways another site (including another port of the same host) could act with a user's session.
 * Calls with `Authorization: Bearer` are not affected: a browser never attaches a token by itself.
 */
import { z } from 'zod';
import { ApiError, isDatabaseDown } from './errors';
import { resolveActor, SESSION_COOKIES, parseCookies } from './actor';
import type { Actor } from './authz';
import type { TokenActor } from './tokens';
import { clientAddressOf } from './client-address';
import { fieldMessages, plainError } from '../zod-text';

export function json(body: unknown, status = 200, headers: Record<string, string> = {}): Response {
  return new Response(JSON.stringify(body), {
    status,
    headers: { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store', ...headers },
  });
}

export function errorResponse(err: unknown): Response {
  if (err instanceof ApiError) {
    const headers: Record<string, string> = {};
    if (err.code === 'rate_limited' && err.details && typeof err.details === 'object' && 'retryAfterSeconds' in err.details) {
      headers['retry-after'] = String((err.details as { retryAfterSeconds: number }).retryAfterSeconds);
    }
    if (err.code === 'unauthenticated') headers['www-authenticate'] = 'Bearer realm="tauforge"';
    if (err.code === 'method_not_allowed' && err.details && typeof err.details === 'object' && 'allow' in err.details) {
      headers.allow = (err.details as { allow: string[] }).allow.join(', ');
    }
    if (err.code === 'unavailable') headers['retry-after'] = '30';
    return json({ error: { code: err.code, message: err.message, details: err.details ?? null } }, err.status, headers);
  }
  if (isDatabaseDown(err)) {
    console.error('tauforge api: database unreachable', err instanceof Error ? err.message : err);
    return errorResponse(new ApiError('unavailable', 'The database cannot be reached just now. Try again in a minute.'));
  }
  console.error('tauforge api: unexpected error', err instanceof Error ? err.message : err);
  return json({ error: { code: 'internal', message: 'Something went wrong on the server.', details: null } }, 500);
}

/** The JSON 405 for a method a route does not have (RFC 9110 §15.5.6: with the methods it does have in Allow). */
export function methodNotAllowed(method: string, allow: string[]): Response {
  return errorResponse(new ApiError('method_not_allowed', `${method} is not supported here; use ${allow.join(', ')}.`, { allow }));
}

/** Field errors from zod as `{path: message}` pairs. */
export function fieldErrors(error: z.ZodError): Record<string, string> {
  return fieldMessages(error, '(body)');
}

export function parseWith<T extends z.ZodType>(schema: T, value: unknown, what = 'request body'): z.infer<T> {
  const r = schema.safeParse(value, { error: plainError });
  if (!r.success) throw new ApiError('validation_failed', `The ${what} is not valid.`, { fields: fieldErrors(r.error) });
  return r.data;
}

/** Largest JSON body any route takes (a revision's params are a few kilobytes). */
export const MAX_JSON_BYTES = 256 * 1024;

function tooLarge(limit: number): ApiError {
  const size = limit >= 1048576 ? `${(limit / 1048576).toFixed(0)} MB` : `${Math.round(limit / 1024)} kB`;
  return new ApiError('too_large', `The request body is larger than the limit of ${size}.`, { limitBytes: limit });
}

/**
 * The request body as bytes, read as a stream and abandoned as soon as it passes `maxBytes` (a
 * Content-Length above the limit is refused before reading anything), so a large or endless body
 * costs at most `maxBytes` of memory. Uploads use it with their own limit.
 */
export async function readBodyCapped(req: Request, maxBytes: number): Promise<Uint8Array<ArrayBuffer>> {
  const declared = req.headers.get('content-length');
  if (declared !== null && /^\d+$/.test(declared) && Number(declared) > maxBytes) throw tooLarge(maxBytes);
  if (!req.body) return new Uint8Array(0);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge(maxBytes);
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

/**
 * A multipart/form-data body read within `maxBytes` (for uploads): the bytes are capped first, then
 * parsed by the platform's own multipart reader.
 */
export async function readFormCapped(req: Request, maxBytes: number): Promise<FormData> {
  const type = req.headers.get('content-type') ?? '';
  if (!/^multipart\/form-data\s*;/i.test(type)) throw new ApiError('unsupported_media_type', 'Send the file as multipart/form-data.');
  const bytes = await readBodyCapped(req, maxBytes);
  try {
    return await new Response(bytes, { headers: { 'content-type': type } }).formData();
  } catch {
    throw new ApiError('bad_request', 'The multipart body could not be read.');
  }
}

const JSON_TYPE = /^application\/(?:[\w.+-]+\+)?json\s*(?:;|$)/i;

/** The body as JSON (capped at `maxBytes`), parsed with `schema`. An empty body reads as `{}`. */
export async function readJson<T extends z.ZodType>(req: Request, schema: T, maxBytes = MAX_JSON_BYTES): Promise<z.infer<T>> {
  const type = req.headers.get('content-type');
  if (type && !JSON_TYPE.test(type)) throw new ApiError('unsupported_media_type', 'Send the request body as JSON (Content-Type: application/json).');
  const bytes = await readBodyCapped(req, maxBytes);
  let body: unknown;
  try {
    const text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    body = text.trim() === '' ? {} : JSON.parse(text);
  } catch {
    throw new ApiError('bad_request', 'The request body is not valid JSON.');
  }
  return parseWith(schema, body);
}

export function readQuery<T extends z.ZodType>(req: Request, schema: T): z.infer<T> {
  const url = new URL(req.url);
  return parseWith(schema, Object.fromEntries(url.searchParams.entries()), 'query string');
}

/**
 * A numeric id, strictly: decimal digits without sign, leading zero, spaces, exponent or hex prefix
 * (`16` yes; `0x10`, `1e1`, ` 16`, `016`, `16.0` no), up to 2^53 − 1. Numbers from JSON pass when they
 * are positive safe integers.
 */
export const idSchema = z.union([
  z.number().int('must be a whole number').positive('must be positive').max(Number.MAX_SAFE_INTEGER),
  z
    .string()
    .regex(/^[1-9][0-9]{0,15}$/, 'must be a whole number written in decimal digits')
    .transform(Number)
    .refine((n) => Number.isSafeInteger(n), 'is too large'),
], { message: 'must be a number' });

/** The same rule for an id in a query string (`?id=`), with a field message. */
export const queryId = (what: string) => z.string({ message: `send ${what}` }).regex(/^[1-9][0-9]{0,15}$/, `${what} must be a whole number written in decimal digits`).transform(Number).refine((n) => Number.isSafeInteger(n), `${what} is too large`);

export function routeId(value: string | undefined, what = 'project'): number {
  const r = idSchema.safeParse(value);
  if (!r.success) throw new ApiError('not_found', `No such ${what}.`);
  return r.data;
}

/**
 * Headers for a file download: always `application/octet-stream` (never the uploader's own media
 * type, which a browser might render), `nosniff`, and an RFC 6266 Content-Disposition with an ASCII
 * fallback `filename` and the exact name as RFC 8187 `filename*=UTF-8''…`, so any name works.
 */
export function attachmentHeaders(filename: string): Record<string, string> {
  const clean = filename.replace(/[\u0000-\u001f\u007f/\\]/g, '_').trim() || 'download';
  const ascii = clean.normalize('NFKD').replace(/[^\x20-\x7e]/g, '_').replace(/["%;]/g, '_');
  // RFC 8187 attr-char: ALPHA / DIGIT / "!#$&+-.^_`|~"; encodeURIComponent leaves !'()* too, which must go as %XX.
  const star = encodeURIComponent(clean).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
  return {
    'content-type': 'application/octet-stream',
    'content-disposition': `attachment; filename="${ascii}"; filename*=UTF-8''${star}`,
    'x-content-type-options': 'nosniff',
  };
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

function siteOrigin(): string | null {
  try {
    return new URL(process.env.NEXTAUTH_URL ?? '').origin;
  } catch {
    return null;
  }
}

function hasSessionCookie(req: Request): boolean {
  const cookies = parseCookies(req.headers.get('cookie'));
  return SESSION_COOKIES.some((n) => Boolean(cookies[n]));
}

/** Is `origin` this site? The configured site URL, or the origin the request itself was sent to. */
export function sameOrigin(req: Request, origin: string): boolean {
  if (origin === 'null') return false;
  let o: URL;
  try {
    o = new URL(origin);
  } catch {
    return false;
  }
  if (o.origin === siteOrigin() || o.origin === new URL(req.url).origin) return true;
  const host = req.headers.get('host');
  return host !== null && o.host === host.toLowerCase();
}

/**
 * The CSRF rule above, for a cookie-authenticated state change: throws 403 for a foreign or missing
 * origin and 415 for a body that is neither JSON nor multipart.
 */
export function checkCookieRequest(req: Request): void {
  if (SAFE_METHODS.has(req.method.toUpperCase())) return;
  if (req.headers.get('authorization')) return;
  if (!hasSessionCookie(req)) return;
  const origin = req.headers.get('origin');
  const site = req.headers.get('sec-fetch-site');
  const ok = origin !== null ? sameOrigin(req, origin) : site === 'same-origin';
  if (!ok) {
    throw new ApiError('forbidden', 'This request came from another site (or did not say where it came from), so it was refused. Use the Tauforge pages, or an API token for scripts.', { reason: 'cross_site' });
  }
  const type = req.headers.get('content-type');
  const hasBody = type !== null || (req.headers.get('content-length') ?? '0') !== '0' || req.headers.has('transfer-encoding');
  if (hasBody && !(type && (JSON_TYPE.test(type) || /^multipart\/form-data\s*;/i.test(type)))) {
    throw new ApiError('unsupported_media_type', 'Send the request body as JSON (or a file as multipart/form-data).');
  }
}

type Ctx<P> = { params: Promise<P> };

/**
 * Wrap a handler: the cross-site check and the actor come first, every thrown error becomes the one
 * error shape. No body has been read when `fn` starts, so a handler can authorise before reading it.
 */
export function route<P = Record<string, string>>(
  fn: (req: Request, actor: Actor | null, params: P) => Promise<Response>,
): (req: Request, ctx: Ctx<P>) => Promise<Response> {
  return async (req, ctx) => {
    try {
      checkCookieRequest(req);
      const actor = await resolveActor(req);
      if (actor?.via === 'token' && (actor as Partial<TokenActor>).scope === 'read' && !SAFE_METHODS.has(req.method.toUpperCase())) {
        throw new ApiError('forbidden', 'This API token is read-only; use a token with write access to change anything.', { reason: 'read_only_token' });
      }
      const params = ctx?.params ? await ctx.params : ({} as P);
      return await fn(req, actor, params);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

export function requireActor(actor: Actor | null): Actor {
  if (!actor) throw new ApiError('unauthenticated', 'Sign in (or send an API token) to do this.');
  return actor;
}

/** The client's address: the TCP peer, or X-Forwarded-For through trusted proxies (lib/server/client-address.ts). */
export function clientAddress(req: Request): string {
  return clientAddressOf(req.headers);
}

/** @deprecated the old name; same as clientAddress. */
export const clientIp = clientAddress;
