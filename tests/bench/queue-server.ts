/**
 * A bare HTTP server for the queue benchmark: the app's own route handlers (the same modules Next.js
 * serves) behind node:http, so the figures measure our request thread without a `next build` first.
 * Run by queue.bench.ts as its own process (the load generator must not share its event loop).
 */
import http from 'node:http';
import * as health from '../../app/api/health/route';
import * as projects from '../../app/api/projects/route';
import * as datasets from '../../app/api/projects/[id]/datasets/route';
import * as jobs from '../../app/api/projects/[id]/jobs/route';
import * as job from '../../app/api/jobs/[id]/route';

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
const ROUTES: [RegExp, Record<string, unknown>, string[]][] = [
  [/^\/api\/health$/, health, []],
  [/^\/api\/projects$/, projects, []],
  [/^\/api\/projects\/(\d+)\/datasets$/, datasets, ['id']],
  [/^\/api\/projects\/(\d+)\/jobs$/, jobs, ['id']],
  [/^\/api\/jobs\/(\d+)$/, job, ['id']],
];

const server = http.createServer(async (req, res) => {
  try {
    const url = new URL(req.url ?? '/', 'http://127.0.0.1');
    const hit = ROUTES.find(([re]) => re.test(url.pathname));
    const fn = hit && (hit[1][req.method ?? 'GET'] as Handler | undefined);
    if (!hit || !fn) {
      res.writeHead(404).end();
      return;
    }
    const m = hit[0].exec(url.pathname)!;
    const params = Object.fromEntries(hit[2].map((k, i) => [k, m[i + 1]]));
    const hasBody = req.method !== 'GET' && req.method !== 'HEAD';
    const request = new Request(url, {
      method: req.method,
      headers: req.headers as Record<string, string>,
      body: hasBody ? (req as unknown as ReadableStream) : undefined,
      // @ts-expect-error Node's fetch needs this for a streamed body
      duplex: 'half',
    });
    const r = await fn(request, { params: Promise.resolve(params) });
    res.writeHead(r.status, Object.fromEntries(r.headers.entries()));
    res.end(Buffer.from(await r.arrayBuffer()));
  } catch (e) {
    res.writeHead(500).end(String(e));
  }
});
server.listen(Number(process.env.PORT), '127.0.0.1', () => console.log('listening'));
process.on('SIGTERM', () => process.exit(0));
