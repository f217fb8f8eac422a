import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = fileURLToPath(new URL('.', import.meta.url));

/**
 * Every API route and the methods it answers, read from app/api/**\/route.ts at build time: proxy.ts
 * answers a method a route does not have with the JSON 405 and its `Allow` list (Next.js itself sends
 * an empty 405). tests/integration/security.test.ts checks this list against the route modules' real
 * exports, so a route written in a way the reader misses fails a test rather than a user.
 * Returns [pattern, methods] pairs; a pattern is the path below /api with `[x]` / `[...x]` segments.
 */
export function apiMethodTable(dir = join(here, 'app', 'api')) {
  const out = [];
  const walk = (d) => {
    for (const name of readdirSync(d)) {
      const p = join(d, name);
      if (statSync(p).isDirectory()) walk(p);
      else if (name === 'route.ts') {
        const src = readFileSync(p, 'utf8');
        const methods = new Set();
        for (const m of src.matchAll(/export\s+(?:const|async\s+function|function)\s+(GET|HEAD|POST|PUT|PATCH|DELETE|OPTIONS)\b/g)) methods.add(m[1]);
        for (const m of src.matchAll(/export\s*\{([^}]*)\}/g)) {
          for (const part of m[1].split(',')) {
            const name = part.trim().split(/\s+as\s+/).pop()?.trim();
            if (name && /^(GET|HEAD|POST|PUT|PATCH|DELETE|OPTIONS)$/.test(name)) methods.add(name);
          }
        }
        const route = relative(join(here, 'app', 'api'), d).split(sep).join('/');
        out.push([route, [...methods].sort()]);
      }
    }
  };
  walk(dir);
  return out.sort((a, b) => a[0].localeCompare(b[0]));
}

/** Headers every answer carries; the Content-Security-Policy comes per request from proxy.ts (it needs a nonce). */
export const securityHeaders = [
  // No page of ours may be framed, by another site or our own (clickjacking the Delete buttons).
  { key: 'X-Frame-Options', value: 'DENY' },
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
  { key: 'Permissions-Policy', value: 'camera=(), microphone=(), geolocation=(), payment=()' },
  { key: 'Cross-Origin-Opener-Policy', value: 'same-origin' },
];

/** @type {import('next').NextConfig} */
const nextConfig = {
  // knex and mysql2 load drivers dynamically; bundling them breaks the Turbopack build.
  serverExternalPackages: ['knex', 'mysql2', 'bcryptjs', 'nodemailer'],
  // `npm test` builds into its own folder so it never clobbers the build `npm start` serves.
  distDir: process.env.TAUFORGE_DIST_DIR || '.next',
  poweredByHeader: false,
  reactStrictMode: true,
  env: { TAUFORGE_API_METHODS: JSON.stringify(apiMethodTable()) },
  async headers() {
    return [{ source: '/:path*', headers: securityHeaders }];
  },
};

export default nextConfig;
