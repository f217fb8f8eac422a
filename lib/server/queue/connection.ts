/**
 * The one Redis queue of Tauforge. Redis holds only the queue (BullMQ); MariaDB holds the durable
 * record of every job (lib/server/queue/service.ts). REDIS_URL points at any Redis; without it,
 * the one `npm start` / `npm test` runs on 127.0.0.1 (TAUFORGE_REDIS_PORT, 6380 by default).
 */
import { Queue } from 'bullmq';
import { Redis } from 'ioredis';

/** The queue's name; TAUFORGE_QUEUE lets tests (or a second site on one Redis) keep their own. */
export const queueName = () => process.env.TAUFORGE_QUEUE || 'tauforge';
/** Pub/sub channel a cancel is announced on; every worker process listens. */
export const cancelChannel = () => `${queueName()}:cancel`;

export function redisUrl(): string {
  return process.env.REDIS_URL || `redis://127.0.0.1:${process.env.TAUFORGE_REDIS_PORT ?? 6380}`;
}

/** A new connection; BullMQ needs maxRetriesPerRequest null on the ones that block. */
export function redis(): Redis {
  return new Redis(redisUrl(), { maxRetriesPerRequest: null, lazyConnect: false });
}

const g = globalThis as unknown as { __tauforgeQueue?: Queue; __tauforgeQueueRedis?: Redis; __tauforgeRedis?: Redis };

export function queue(): Queue {
  if (!g.__tauforgeQueue) {
    // A connection handed to BullMQ as an instance is shared: Queue.close() leaves it open, closeQueue() ends it.
    g.__tauforgeQueueRedis = redis();
    g.__tauforgeQueue = new Queue(queueName(), { connection: g.__tauforgeQueueRedis });
  }
  return g.__tauforgeQueue;
}

/** A shared connection for plain commands (publish). */
export function plainRedis(): Redis {
  if (!g.__tauforgeRedis) g.__tauforgeRedis = new Redis(redisUrl(), { maxRetriesPerRequest: 3 });
  return g.__tauforgeRedis;
}

export async function closeQueue(): Promise<void> {
  const q = g.__tauforgeQueue;
  const r = g.__tauforgeRedis;
  const qr = g.__tauforgeQueueRedis;
  g.__tauforgeQueue = undefined;
  g.__tauforgeRedis = undefined;
  g.__tauforgeQueueRedis = undefined;
  await q?.close();
  r?.disconnect();
  qr?.disconnect();
}

/** BullMQ ids must not be plain integers: a job row's BullMQ id, and a sweep point's. */
export const bullId = (jobId: number) => `j${jobId}`;
/** A batch of sweep points: named by its points, so the same batch queued twice is one job. */
export const pointsId = (sweepId: number, idx: readonly number[]) =>
  idx.length === 1 ? `s${sweepId}-p${idx[0]}` : `s${sweepId}-p${idx[0]}-${idx[idx.length - 1]}-n${idx.length}`;
