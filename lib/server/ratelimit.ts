/**
 * Attempt limits for sign-in, sign-up and password reset, per account (e-mail address) and per
 * client address. Memory store: correct for the single `next start` process Tauforge runs; a
 * multi-process deployment would switch these to RateLimiterMySQL against the same MariaDB.
 */
import { RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible';
import { ApiError } from './errors';

type Kind = 'signin' | 'signup' | 'reset';

const LIMITS: Record<Kind, { account: [number, number]; ip: [number, number] }> = {
  // [points, seconds]
  signin: { account: [8, 15 * 60], ip: [60, 15 * 60] },
  signup: { account: [4, 60 * 60], ip: [30, 60 * 60] },
  reset: { account: [4, 60 * 60], ip: [30, 60 * 60] },
};

const g = globalThis as unknown as { __tauforgeLimiters?: Map<string, RateLimiterMemory> };

function limiter(kind: Kind, scope: 'account' | 'ip'): RateLimiterMemory {
  g.__tauforgeLimiters ??= new Map();
  const key = `${kind}:${scope}`;
  let l = g.__tauforgeLimiters.get(key);
  if (!l) {
    const [points, duration] = LIMITS[kind][scope];
    l = new RateLimiterMemory({ keyPrefix: key, points, duration });
    g.__tauforgeLimiters.set(key, l);
  }
  return l;
}

export class RateLimitedError extends ApiError {
  constructor(seconds: number) {
    const minutes = Math.max(1, Math.ceil(seconds / 60));
    super('rate_limited', `Too many attempts. Wait about ${minutes} minute${minutes === 1 ? '' : 's'} and try again.`, { retryAfterSeconds: seconds });
  }
}

/** Count one attempt against both the account and the client address; throws when over the limit. */
export async function consumeAttempt(kind: Kind, email: string, ip: string): Promise<void> {
  try {
    await limiter(kind, 'account').consume(email.trim().toLowerCase());
    await limiter(kind, 'ip').consume(ip);
  } catch (e) {
    if (e instanceof RateLimiterRes) throw new RateLimitedError(Math.ceil(e.msBeforeNext / 1000));
    throw e;
  }
}

/** After a successful sign-in the account's counter starts again. */
export async function clearAccount(kind: Kind, email: string): Promise<void> {
  await limiter(kind, 'account').delete(email.trim().toLowerCase());
}

/** Tests only: forget every counter. */
export function resetRateLimits(): void {
  g.__tauforgeLimiters?.clear();
}
