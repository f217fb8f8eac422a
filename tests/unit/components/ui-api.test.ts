/**
 * The pages' API client against the server's own error writer: an answer made by errorResponse()
 * (lib/server/http.ts, the `{"error": {"code", "message", "details"}}` shape the README documents,
 * statuses from RFC 9110 §15 as mapped in lib/server/errors.ts) must come out of the client as an
 * ApiClientError carrying the same status, code, message and details.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ApiClientError, fetcher, getBlob, send } from '../../../components/ui/api';
import { forkProject } from '../../../components/projects/fork';
import { ApiError } from '../../../lib/server/errors';
import { errorResponse, json } from '../../../lib/server/http';

function answer(res: Response) {
  const calls: { url: string; init?: RequestInit }[] = [];
  vi.stubGlobal('fetch', async (url: string, init?: RequestInit) => {
    calls.push({ url, init });
    return res;
  });
  return calls;
}

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('components/ui/api', () => {
  it('turns a 409 from the server into an ApiClientError with the newer head in details', async () => {
    const head = { id: 7, number: 3, message: 'order 9' };
    answer(errorResponse(new ApiError('conflict', 'Someone saved a newer revision.', { baseRevision: 6, head })));
    const err = (await send('POST', '/api/projects/1/revisions', { params: {}, message: 'x', baseRevision: 6 }).catch((e) => e)) as ApiClientError;
    expect(err).toBeInstanceOf(ApiClientError);
    expect([err.status, err.code, err.message]).toEqual([409, 'conflict', 'Someone saved a newer revision.']);
    expect(err.details).toEqual({ baseRevision: 6, head });
  });

  it('hands validation field errors out as fields', async () => {
    answer(errorResponse(new ApiError('validation_failed', 'The request body is not valid.', { fields: { name: 'enter a name' } })));
    const err = (await fetcher('/api/projects').catch((e) => e)) as ApiClientError;
    expect(err.status).toBe(400);
    expect(err.fields).toEqual({ name: 'enter a name' });
  });

  it('still throws a typed error when the answer is not our JSON (a proxy page)', async () => {
    answer(new Response('<html>bad gateway</html>', { status: 502, statusText: 'Bad Gateway' }));
    const err = (await getBlob('/api/exports/1/download').catch((e) => e)) as ApiClientError;
    expect(err).toBeInstanceOf(ApiClientError);
    expect([err.status, err.code, err.message]).toEqual([502, 'error', 'Bad Gateway']);
    expect(err.fields).toEqual({});
  });

  it('sends plain objects as JSON and gives undefined for 204', async () => {
    const calls = answer(new Response(null, { status: 204 }));
    expect(await send('PATCH', '/api/projects/1', { name: 'n' })).toBeUndefined();
    expect(calls[0].init?.body).toBe('{"name":"n"}');
    expect((calls[0].init?.headers as Record<string, string>)['content-type']).toBe('application/json');
  });
});

describe('components/projects/fork', () => {
  it('forks at a revision and answers where the fork is', async () => {
    const calls = answer(json({ id: 42, name: 'x (fork)' }, 201));
    expect(await forkProject(5, 11)).toEqual({ id: '42' });
    expect(calls[0].url).toBe('/api/projects/5/fork');
    expect(calls[0].init?.body).toBe('{"revision":11}');
  });

  it('answers the server message when the fork is refused', async () => {
    answer(errorResponse(new ApiError('unauthenticated', 'Sign in (or send an API token) to do this.')));
    expect(await forkProject('5')).toEqual({ error: 'Sign in (or send an API token) to do this.' });
  });
});
