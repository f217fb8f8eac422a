/**
 * Where the sign-in form goes afterwards. The hostile inputs are the classic open-redirect forms (OWASP
 * "Unvalidated Redirects and Forwards" cheat sheet, common practice); what a browser makes of each is
 * decided by the WHATWG URL parser, which Node's URL implements.
 */
import { describe, expect, it } from 'vitest';
import { safeCallbackPath } from '../../../lib/auth/callback';

const SITE = 'http://127.0.0.1:3000';

describe('safeCallbackPath', () => {
  it('keeps paths on our site, with query and fragment', () => {
    expect(safeCallbackPath('/projects/12/history?x=1#r3', SITE)).toBe('/projects/12/history?x=1#r3');
    expect(safeCallbackPath('/', SITE)).toBe('/');
    expect(safeCallbackPath(`${SITE}/settings/tokens`, SITE)).toBe('/settings/tokens');
  });

  it('sends every way off the site to the default', () => {
    for (const raw of [
      '/\\evil.example/', // the report: %2F%5Cevil.example%2F
      '\\/evil.example',
      '//evil.example',
      '/\t/evil.example',
      '/%09/evil.example'.replace('%09', '\t'),
      'https://evil.example/projects',
      'http://127.0.0.1:4000/projects', // another port is another origin
      'javascript:alert(1)',
      'data:text/html,hi',
      'evil.example',
      '',
      undefined,
    ]) {
      const got = safeCallbackPath(raw, SITE);
      expect(got, String(raw)).toBe('/projects');
      // Whatever comes back, a browser resolving it stays here.
      expect(new URL(got, SITE).origin).toBe(SITE);
    }
  });

  it('never returns something that resolves off the site, for a sweep of prefixes', () => {
    const tails = ['evil.example', '/evil.example', '\\evil.example', '@evil.example', '%2f%2fevil.example', '%5cevil.example'];
    const heads = ['/', '//', '/\\', '\\\\', '/./', '/../', ' /', '/\n/', '/\r\\'];
    for (const h of heads) for (const t of tails) {
      const got = safeCallbackPath(h + t, SITE);
      expect(new URL(got, SITE).origin, JSON.stringify(h + t)).toBe(SITE);
      expect(got.startsWith('//') || got.startsWith('/\\')).toBe(false);
    }
  });
});
