/**
 * Thin helpers for route handlers: resolve the actor, parse with zod, call a service, shape the
 * response. Every failure leaves as `{error: {code, message, details}}`.
 */
import { z } from 'zod';
import { ApiError } from './errors';
import { resolveActor } from './actor';
import type { Actor } from './authz';
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
    return json({ error: { code: err.code, message: err.message, details: err.details ?? null } }, err.status, headers);
  }
  console.error('tauforge api: unexpected error', err instanceof Error ? err.message : err);
  return json({ error: { code: 'internal', message: 'Something went wrong on the server.', details: null } }, 500);
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

export async function readJson<T extends z.ZodType>(req: Request, schema: T): Promise<z.infer<T>> {
  let body: unknown;
  try {
    const text = await req.text();
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

/** A numeric id from a dynamic route segment. */
export const idSchema = z.coerce.number({ message: 'must be a number' }).int('must be a whole number').positive('must be positive').max(Number.MAX_SAFE_INTEGER);

export function routeId(value: string | undefined, what = 'project'): number {
  const r = idSchema.safeParse(value);
  if (!r.success) throw new ApiError('not_found', `No such ${what}.`);
  return r.data;
}

type Ctx<P> = { params: Promise<P> };

/** Wrap a handler: the actor is resolved first, every thrown error becomes the one error shape. */
export function route<P = Record<string, string>>(
  fn: (req: Request, actor: Actor | null, params: P) => Promise<Response>,
): (req: Request, ctx: Ctx<P>) => Promise<Response> {
  return async (req, ctx) => {
    try {
      const actor = await resolveActor(req);
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

export function clientIp(req: Request): string {
  return req.headers.get('x-forwarded-for')?.split(',')[0]?.trim() || req.headers.get('x-real-ip') || 'local';
}
