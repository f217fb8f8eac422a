/**
 * Runs before every page and API request (Next.js 16 "proxy", formerly middleware).
 *
 * Pages: a fresh nonce per request and a Content-Security-Policy that allows only scripts carrying it
 * (`'strict-dynamic'` lets those load our own chunks). Next.js reads the policy from the request
 * header and puts the nonce on every script it writes, so no inline script runs without it — an
 * injected `<script>` or `onerror=` attribute does not. `frame-ancestors 'none'` forbids framing.
 * Styles keep 'unsafe-inline': React writes `style=""` attributes, and styles cannot run code.
 * `'wasm-unsafe-eval'` lets the symmetry finder's WebAssembly compile; it allows no JavaScript eval.
 *
 * API: a method a route does not have answers the JSON 405 with `Allow` (Next.js would send an empty
 * one). The table of routes and methods is read from app/api at build time (next.config.mjs).
 */
import { NextResponse, type NextRequest } from 'next/server';

export function contentSecurityPolicy(nonce: string, dev = process.env.NODE_ENV === 'development'): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic' 'wasm-unsafe-eval'${dev ? " 'unsafe-eval'" : ''}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self' data:",
    `connect-src 'self'${dev ? ' ws:' : ''}`,
    "worker-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join('; ');
}

type Table = [string, string[]][];

let table: { parts: string[]; methods: string[] }[] | null = null;

function routes() {
  if (!table) {
    let raw: Table = [];
    try {
      raw = JSON.parse(process.env.TAUFORGE_API_METHODS ?? '[]') as Table;
    } catch {
      raw = [];
    }
    table = raw.map(([route, methods]) => ({ parts: route.split('/'), methods }));
  }
  return table;
}

/** How well a route pattern matches a path: null for no match; higher for more literal segments (Next.js's own precedence). */
function score(parts: string[], segs: string[]): number[] | null {
  const s: number[] = [];
  for (let i = 0; i < parts.length; i++) {
    const p = parts[i];
    if (p.startsWith('[...')) return i < segs.length ? [...s, 1] : null;
    if (i >= segs.length) return null;
    if (p.startsWith('[')) s.push(2);
    else if (p === segs[i]) s.push(3);
    else return null;
  }
  return parts.length === segs.length ? s : null;
}

function better(a: number[], b: number[]): boolean {
  for (let i = 0; i < Math.max(a.length, b.length); i++) {
    if ((a[i] ?? 0) !== (b[i] ?? 0)) return (a[i] ?? 0) > (b[i] ?? 0);
  }
  return false;
}

/** The methods the route answering `pathname` has, or null when no specific route claims it. */
export function allowedMethods(pathname: string): string[] | null {
  const segs = pathname.replace(/^\/api\/?/, '').split('/').filter(Boolean).map((s) => {
    try {
      return decodeURIComponent(s);
    } catch {
      return s;
    }
  });
  let best: { s: number[]; methods: string[]; catchAll: boolean } | null = null;
  for (const r of routes()) {
    const s = score(r.parts, segs);
    if (s && (!best || better(s, best.s))) best = { s, methods: r.methods, catchAll: r.parts.length === 1 && r.parts[0].startsWith('[...') };
  }
  if (!best || best.catchAll) return null;
  const m = new Set(best.methods);
  if (m.has('GET')) m.add('HEAD');
  m.add('OPTIONS');
  return [...m].sort();
}

export function proxy(request: NextRequest) {
  const { pathname } = request.nextUrl;
  if (pathname === '/api' || pathname.startsWith('/api/')) {
    const allow = allowedMethods(pathname);
    if (allow && !allow.includes(request.method.toUpperCase())) {
      const body = { error: { code: 'method_not_allowed', message: `${request.method} is not supported here; use ${allow.join(', ')}.`, details: { allow } } };
      return new NextResponse(JSON.stringify(body), {
        status: 405,
        headers: { 'content-type': 'application/json; charset=utf-8', allow: allow.join(', '), 'cache-control': 'no-store' },
      });
    }
    return NextResponse.next();
  }
  const nonce = btoa(crypto.randomUUID());
  const csp = contentSecurityPolicy(nonce);
  const headers = new Headers(request.headers);
  headers.set('x-nonce', nonce);
  headers.set('content-security-policy', csp);
  const res = NextResponse.next({ request: { headers } });
  res.headers.set('content-security-policy', csp);
  return res;
}

export const config = {
  matcher: [
    {
      source: '/((?!_next/static|_next/image|favicon.ico|icon.svg).*)',
      missing: [
        { type: 'header', key: 'next-router-prefetch' },
        { type: 'header', key: 'purpose', value: 'prefetch' },
      ],
    },
  ],
};
