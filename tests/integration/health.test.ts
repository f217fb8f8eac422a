import { afterAll, describe, expect, it } from 'vitest';
import { mkdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { GET } from '../../app/api/health/route';
import { closeDb } from '../../lib/server/db';
import { closeQueue, queue } from '../../lib/server/queue/connection';
import { closeQueueHealth } from '../../lib/server/queue/health';
import { makeUser } from './api-fixtures';
import { buildWorker, root, startWorker, until, type WorkerProc } from './queue-helpers';

const workers: WorkerProc[] = [];
afterAll(async () => {
  await Promise.all(workers.map((w) => w.kill('SIGKILL')));
  await closeQueueHealth();
  await closeQueue();
  await closeDb();
});

const get = (cookie?: string) => GET(new Request('http://127.0.0.1/api/health', { headers: cookie ? { cookie } : {} }));

describe('GET /api/health', () => {
  it('reports the database as reachable with the latest migration', async () => {
    const res = await GET();
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.ok).toBe(true);
    expect(body.database.reachable).toBe(true);
    expect(body.database.latestMigration).toMatch(/^\d{14}_.+\.ts$/);
  });

  it('answers 503 when the database is down', async () => {
    await closeDb();
    const saved = process.env.TAUFORGE_DB_PORT;
    process.env.TAUFORGE_DB_PORT = '1'; // nothing listens on port 1
    try {
      const res = await GET();
      expect(res.status).toBe(503);
      const body = await res.json();
      expect(body.database.reachable).toBe(false);
    } finally {
      await closeDb();
      process.env.TAUFORGE_DB_PORT = saved;
    }
  });
});

describe('GET /api/health: the job queue (a Redis of this test\'s own)', () => {
  it('says only reachable / unreachable to everyone; admins see waiting, active and live workers; Redis stopped → 503', async () => {
    const { startRedis } = (await import(join(root, 'scripts', 'lib', 'redis.mjs'))) as { startRedis: (o: object) => Promise<{ url: string; port: number; stop: () => Promise<void> }> };
    const { freePort } = (await import(join(root, 'scripts', 'lib', 'proc.mjs'))) as { freePort: () => Promise<number> };
    const dir = join(root, '.data', `test-health-redis-${process.pid}`);
    mkdirSync(dir, { recursive: true });
    const redis = await startRedis({ dataDir: dir, port: await freePort(), persist: false, fresh: true });
    const saved = { url: process.env.REDIS_URL, queue: process.env.TAUFORGE_QUEUE };
    const QUEUE = `test-health-${process.pid}`;
    let stopped = false;
    try {
      await closeQueue();
      process.env.REDIS_URL = redis.url;
      process.env.TAUFORGE_QUEUE = QUEUE;
      const admin = await makeUser('health-admin', { siteRole: 'admin' });
      const member = await makeUser('health-member');

      // Anyone (anonymous, a member): two words, no counts.
      for (const cookie of [undefined, member.cookie]) {
        const r = await get(cookie);
        expect(r.status).toBe(200);
        expect((await r.json()).queue).toEqual({ reachable: true, status: 'reachable' });
      }

      // No worker yet: two jobs wait.
      await queue().add('export', { jobId: 0 }, { jobId: 'health-a', removeOnComplete: true });
      await queue().add('export', { jobId: 0 }, { jobId: 'health-b', removeOnComplete: true });
      let q = (await (await get(admin.cookie)).json()).queue;
      expect(q).toMatchObject({ reachable: true, status: 'reachable', waiting: 2, active: 0, workers: 0 });

      // Two worker processes: both counted; they take the jobs (unknown rows: nothing to do), nothing waits.
      const main = await buildWorker();
      for (let i = 0; i < 2; i++) workers.push(await startWorker(main, { REDIS_URL: redis.url, TAUFORGE_QUEUE: QUEUE }));
      q = await until('workers', async () => {
        const x = (await (await get(admin.cookie)).json()).queue;
        return x.workers === 2 && x.waiting === 0 && x.active === 0 ? x : null;
      }, 20_000);
      expect(q.workers).toBe(2);

      // One worker killed: its connection drops, the count follows.
      await workers[0].kill('SIGKILL');
      await until('one worker', async () => (await (await get(admin.cookie)).json()).queue.workers === 1, 20_000);
      await workers[1].kill();

      await closeQueue();
      // Redis stopped: 503 within the probe's time limit; anyone reads "unreachable", admins the reason.
      await redis.stop();
      stopped = true;
      const t0 = Date.now();
      const down = await get();
      expect(Date.now() - t0).toBeLessThan(3000);
      expect(down.status).toBe(503);
      const body = await down.json();
      expect(body.ok).toBe(false);
      expect(body.database.reachable).toBe(true);
      expect(body.queue).toEqual({ reachable: false, status: 'unreachable' });
      const adminDown = await (await get(admin.cookie)).json();
      expect(adminDown.queue.reachable).toBe(false);
      expect(adminDown.queue.error).toMatch(/\S/);
      expect(adminDown.queue.workers).toBeUndefined();
      // Asked again while Redis stays away: still a quick answer.
      const t1 = Date.now();
      expect((await get()).status).toBe(503);
      expect(Date.now() - t1).toBeLessThan(3000);
    } finally {
      await closeQueueHealth();
      await closeQueue();
      process.env.REDIS_URL = saved.url;
      process.env.TAUFORGE_QUEUE = saved.queue;
      if (!stopped) await redis.stop();
      rmSync(dir, { recursive: true, force: true });
      rmSync(`${dir}-run`, { recursive: true, force: true });
    }
  });
});
