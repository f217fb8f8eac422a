/**
 * Is the job queue alive? A PING to Redis on a connection of its own (one that gives up quickly, unlike the
 * queue's blocking ones), and for site admins the queue's waiting / active / delayed counts and the number of
 * worker processes connected to it (BullMQ names each worker's Redis connection after the queue; a worker
 * that dies drops its connection, so the count is of live workers). Never waits longer than
 * TAUFORGE_HEALTH_QUEUE_MS (1 s by default): a Redis that does not answer in time is "unreachable".
 */
import { Queue } from 'bullmq';
import { Redis } from 'ioredis';
import { queueName, redisUrl } from './connection';

export interface QueueHealth {
  reachable: boolean;
  status: 'reachable' | 'unreachable';
  /** Admins only. */
  waiting?: number;
  active?: number;
  delayed?: number;
  workers?: number;
  error?: string;
}

const g = globalThis as unknown as { __tauforgeHealthRedis?: { url: string; name: string; redis: Redis; queue: Queue } };

function probeConnection() {
  const url = redisUrl();
  const name = queueName();
  const cur = g.__tauforgeHealthRedis;
  if (cur && cur.url === url && cur.name === name) return cur;
  if (cur) {
    void cur.queue.close().catch(() => {});
    cur.redis.disconnect();
  }
  const redis = new Redis(url, {
    maxRetriesPerRequest: 1,
    connectTimeout: 1000,
    // Keep trying in the background (Redis may come back), but never pile up commands while it is away.
    enableOfflineQueue: true,
    retryStrategy: (times) => Math.min(250 * times, 2000),
  });
  redis.on('error', () => {}); // reported through the probe, not as an unhandled event
  // The probe must not keep a process alive that is otherwise done (tests, a CLI run).
  redis.on('connect', () => (redis as unknown as { stream?: { unref?: () => void } }).stream?.unref?.());
  const queue = new Queue(name, { connection: redis });
  queue.on('error', () => {});
  g.__tauforgeHealthRedis = { url, name, redis, queue };
  return g.__tauforgeHealthRedis;
}

/** Close the probe connection (tests; a server that stops). */
export async function closeQueueHealth(): Promise<void> {
  const cur = g.__tauforgeHealthRedis;
  g.__tauforgeHealthRedis = undefined;
  if (cur) {
    cur.redis.disconnect();
    await within(cur.queue.close(), 2000).catch(() => {});
  }
}

function within<T>(p: Promise<T>, ms: number): Promise<T> {
  let timer: NodeJS.Timeout;
  return Promise.race([
    p.finally(() => clearTimeout(timer)),
    new Promise<never>((_, reject) => {
      timer = setTimeout(() => reject(new Error(`Redis did not answer within ${ms} ms`)), ms);
    }),
  ]);
}

/** The queue's health; `detail` (site admins) adds the counts, the live workers and Redis's own error text. */
export async function queueHealth(detail = false): Promise<QueueHealth> {
  const ms = Number(process.env.TAUFORGE_HEALTH_QUEUE_MS) > 0 ? Number(process.env.TAUFORGE_HEALTH_QUEUE_MS) : 1000;
  const c = probeConnection();
  try {
    if (c.redis.status !== 'ready' && c.redis.status !== 'connecting' && c.redis.status !== 'connect' && c.redis.status !== 'wait') {
      // Reconnecting after a loss: do not queue a command behind the back-off, say so now.
      throw new Error(`Redis connection is ${c.redis.status}`);
    }
    const pong = await within(c.redis.ping(), ms);
    if (pong !== 'PONG') throw new Error(`Redis answered ${String(pong).slice(0, 40)}`);
    if (!detail) return { reachable: true, status: 'reachable' };
    const [counts, workers] = await within(Promise.all([c.queue.getJobCounts('waiting', 'prioritized', 'active', 'delayed'), c.queue.getWorkersCount()]), ms);
    return {
      reachable: true,
      status: 'reachable',
      waiting: (counts.waiting ?? 0) + (counts.prioritized ?? 0),
      active: counts.active ?? 0,
      delayed: counts.delayed ?? 0,
      workers,
    };
  } catch (err) {
    const q: QueueHealth = { reachable: false, status: 'unreachable' };
    if (detail) q.error = err instanceof Error ? err.message.split('\n')[0].slice(0, 200) : 'unknown error';
    return q;
  }
}
