/**
 * Attempt limits for sign-in, sign-up and password reset. Memory store: correct for the single
 * `next start` process Tauforge runs; a multi-process deployment would move these counters to MariaDB
 * or Redis (the state below is small and keyed by strings).
 *
 * The keys are chosen so that a stranger cannot lock an owner out:
 * - per client address, over all accounts (stops one address spraying many accounts);
 * - per account *and* address for sign-in failures, with a delay that doubles after the fifth failure
 *   (30 s, 1 min, 2 min, … up to 1 h) — guessing from one address slows down exponentially while the
 *   owner, signing in from their own address, is never delayed by someone else's failures;
 * - per account only for *mail* we send (reset and sign-up links), where a cap protects the mailbox and
 *   the answer to the caller stays the same whether or not a message went out.
 * When an account collects many failures (from any addresses) its owner is told by mail, once per window.
 */
import { RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible';
import { ApiError } from './errors';

type Kind = 'signin' | 'signup' | 'reset';

/** [points, seconds] per client address and per account + address. */
const LIMITS: Record<Kind, { ip: [number, number]; pair: [number, number] }> = {
  signin: { ip: [60, 15 * 60], pair: [1000, 15 * 60] }, // sign-in pairs are governed by the failure delays below
  signup: { ip: [30, 60 * 60], pair: [6, 60 * 60] },
  reset: { ip: [30, 60 * 60], pair: [6, 60 * 60] },
};

/** Messages one account may receive per hour for each purpose; further requests are answered alike but send nothing. */
export const MAIL_PER_ACCOUNT_PER_HOUR = 4;

/** Free failures per account + address before the delays start. */
export const FREE_FAILURES = 4;
/** Failures on one account (from anywhere) within WATCH_SECONDS that make us warn its owner. */
export const WARN_AFTER_FAILURES = 10;
const WATCH_SECONDS = 60 * 60;

/** Seconds to wait after the n-th consecutive failure of an account + address: 0 … 0, 30, 60, 120, … ≤ 3600. */
export function failureDelaySeconds(failures: number): number {
  if (failures <= FREE_FAILURES) return 0;
  return Math.min(3600, 30 * 2 ** (failures - FREE_FAILURES - 1));
}

interface PairState {
  failures: number;
  lockedUntil: number;
  last: number;
}

interface AccountWatch {
  failures: number[];
  warnedAt: number;
}

interface Store {
  limiters: Map<string, RateLimiterMemory>;
  pairs: Map<string, PairState>;
  watch: Map<string, AccountWatch>;
}

const g = globalThis as unknown as { __tauforgeLimits?: Store };

function store(): Store {
  g.__tauforgeLimits ??= { limiters: new Map(), pairs: new Map(), watch: new Map() };
  return g.__tauforgeLimits;
}

function limiter(key: string, points: number, duration: number): RateLimiterMemory {
  const s = store();
  let l = s.limiters.get(key);
  if (!l) {
    l = new RateLimiterMemory({ keyPrefix: key, points, duration });
    s.limiters.set(key, l);
  }
  return l;
}

export class RateLimitedError extends ApiError {
  constructor(seconds: number) {
    const s = Math.max(1, Math.ceil(seconds));
    const wait = s < 90 ? `${s} seconds` : `about ${Math.ceil(s / 60)} minutes`;
    super('rate_limited', `Too many attempts. Wait ${wait} and try again.`, { retryAfterSeconds: s });
  }
}

const norm = (email: string) => email.trim().toLowerCase();
const pairKey = (email: string, ip: string) => `${norm(email)}|${ip}`;

async function consume(l: RateLimiterMemory, key: string): Promise<void> {
  try {
    await l.consume(key);
  } catch (e) {
    if (e instanceof RateLimiterRes) throw new RateLimitedError(e.msBeforeNext / 1000);
    throw e;
  }
}

/** Count one attempt against the client address and the account + address; throws when over a limit. */
export async function consumeAttempt(kind: Kind, email: string, ip: string): Promise<void> {
  const [ipPoints, ipSeconds] = LIMITS[kind].ip;
  const [pairPoints, pairSeconds] = LIMITS[kind].pair;
  await consume(limiter(`${kind}:ip`, ipPoints, ipSeconds), ip);
  await consume(limiter(`${kind}:pair`, pairPoints, pairSeconds), pairKey(email, ip));
  if (kind === 'signin') {
    const p = store().pairs.get(pairKey(email, ip));
    const now = Date.now();
    if (p && p.lockedUntil > now) throw new RateLimitedError((p.lockedUntil - now) / 1000);
  }
}

/** May we send this account another message of this kind this hour? Counts the message when yes. */
export async function mailBudget(kind: 'signup' | 'reset' | 'warning', email: string): Promise<boolean> {
  try {
    await limiter(`${kind}:mail`, MAIL_PER_ACCOUNT_PER_HOUR, 3600).consume(norm(email));
    return true;
  } catch (e) {
    if (e instanceof RateLimiterRes) return false;
    throw e;
  }
}

/**
 * Record a failed sign-in: the account + address waits longer after each failure past the free ones.
 * Answers whether the owner should now be warned (many failures on the account, once per hour).
 */
export function signInFailed(email: string, ip: string): { warnOwner: boolean; failuresOnAccount: number } {
  const s = store();
  const now = Date.now();
  const key = pairKey(email, ip);
  const p = s.pairs.get(key);
  // A pair that has been quiet for a day starts again.
  const failures = p && now - p.last < 86_400_000 ? p.failures + 1 : 1;
  s.pairs.set(key, { failures, lockedUntil: now + failureDelaySeconds(failures) * 1000, last: now });
  const w = s.watch.get(norm(email)) ?? { failures: [], warnedAt: 0 };
  w.failures = w.failures.filter((t) => now - t < WATCH_SECONDS * 1000);
  w.failures.push(now);
  let warnOwner = false;
  if (w.failures.length >= WARN_AFTER_FAILURES && now - w.warnedAt > WATCH_SECONDS * 1000) {
    w.warnedAt = now;
    warnOwner = true;
  }
  s.watch.set(norm(email), w);
  return { warnOwner, failuresOnAccount: w.failures.length };
}

/** After a successful sign-in this account + address starts again. */
export function signInSucceeded(email: string, ip: string): void {
  store().pairs.delete(pairKey(email, ip));
}

/** Tests only: forget every counter. */
export function resetRateLimits(): void {
  g.__tauforgeLimits = undefined;
}
