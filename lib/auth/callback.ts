/**
 * Where to go after signing in. A `callbackUrl` is resolved as a browser would resolve it against our
 * own origin (WHATWG URL: `\` counts as `/` in http URLs, tabs and newlines are dropped), and kept only
 * when the result is on our origin; then only its path, query and fragment are used. So `/\evil.example/`,
 * `//evil.example`, `/%09/evil.example`, `https://evil.example` and `javascript:` all fall back.
 */
export const DEFAULT_AFTER_SIGNIN = '/projects';

export function safeCallbackPath(raw: string | null | undefined, origin: string, fallback = DEFAULT_AFTER_SIGNIN): string {
  if (!raw || raw.length > 2000) return fallback;
  let base: URL;
  let url: URL;
  try {
    base = new URL(origin);
    url = new URL(raw, base);
  } catch {
    return fallback;
  }
  if (url.origin !== base.origin || (url.protocol !== 'http:' && url.protocol !== 'https:')) return fallback;
  // Only relative paths are accepted as input; an absolute URL to our own origin is fine too.
  if (!raw.startsWith('/') && !raw.startsWith(base.origin + '/')) return fallback;
  const path = url.pathname + url.search + url.hash;
  // The path itself must not start with two slashes (which a later resolution would read as a host).
  return path.startsWith('//') ? fallback : path;
}
