/**
 * Work that must not run on the request path. Account requests (sign-up, password reset) answer before
 * anything that depends on whether the address has an account happens — looking the account up,
 * issuing a link, talking to the mail relay — so the answer takes the same time for known and unknown
 * addresses (no account discovery by timing) and a slow mail relay never slows a page.
 *
 * The seam: `enqueue(task)` hands a named task with a JSON payload to the current carrier. The default
 * carrier is in-process (a FIFO drained after the response, retried with backoff); when the job queue
 * lands, `setOutboxCarrier()` sends the same tasks to a BullMQ queue and its worker calls `runTask()`.
 */
import { sendMail } from './mail';

export interface OutboxTask {
  kind: string;
  payload: Record<string, unknown>;
}

type Handler = (payload: Record<string, unknown>) => Promise<void>;
type Carrier = (task: OutboxTask) => Promise<void>;

interface State {
  handlers: Map<string, Handler>;
  queue: { task: OutboxTask; attempt: number }[];
  running: boolean;
  /** Retries waiting for their backoff to pass. */
  pending: number;
  carrier: Carrier | null;
  failures: { task: OutboxTask; error: string }[];
}

const g = globalThis as unknown as { __tauforgeOutbox?: State };

function state(): State {
  g.__tauforgeOutbox ??= { handlers: new Map(), queue: [], running: false, pending: 0, carrier: null, failures: [] };
  return g.__tauforgeOutbox;
}

const MAX_ATTEMPTS = 4;

/** Register what a task kind does (each module registers its own kinds when it loads). */
export function defineTask(kind: string, handler: Handler): void {
  state().handlers.set(kind, handler);
}

/** Run one task now (the in-process drain and a queue worker both call this). */
export async function runTask(task: OutboxTask): Promise<void> {
  const h = state().handlers.get(task.kind);
  if (!h) throw new Error(`outbox: no handler for task "${task.kind}"`);
  await h(task.payload);
}

/** Route tasks elsewhere (a job queue); null goes back to the in-process drain. */
export function setOutboxCarrier(carrier: Carrier | null): void {
  state().carrier = carrier;
}

/** Queue a task; returns at once. The task runs after the current request has been answered. */
export async function enqueue(kind: string, payload: Record<string, unknown>): Promise<void> {
  const s = state();
  const task = { kind, payload };
  if (s.carrier) return s.carrier(task);
  s.queue.push({ task, attempt: 1 });
  if (!s.running) {
    s.running = true;
    setImmediate(() => void drain());
  }
}

async function drain(): Promise<void> {
  const s = state();
  while (s.queue.length) {
    const item = s.queue.shift()!;
    try {
      await runTask(item.task);
    } catch (err) {
      const error = err instanceof Error ? err.message : String(err);
      if (item.attempt < MAX_ATTEMPTS) {
        // Back off 1 s, 4 s, 16 s before trying again (a mail relay that is briefly away).
        const delay = process.env.TAUFORGE_TEST === '1' ? 10 : 1000 * 4 ** (item.attempt - 1);
        s.pending += 1;
        setTimeout(() => {
          s.pending -= 1;
          s.queue.push({ task: item.task, attempt: item.attempt + 1 });
          if (!s.running) {
            s.running = true;
            void drain();
          }
        }, delay);
      } else {
        s.failures.push({ task: item.task, error });
        console.error(`tauforge outbox: task ${item.task.kind} failed ${MAX_ATTEMPTS} times: ${error}`);
      }
    }
  }
  s.running = false;
}

/** Tests: wait until every queued task has run (or given up). */
export async function flushOutbox(timeoutMs = 20_000): Promise<void> {
  const s = state();
  const started = Date.now();
  while (s.running || s.queue.length || s.pending > 0) {
    if (Date.now() - started > timeoutMs) throw new Error('outbox: still busy');
    await new Promise((r) => setTimeout(r, 5));
  }
}

/** Tasks that gave up (for the tests and the logs). */
export function outboxFailures(): { task: OutboxTask; error: string }[] {
  return state().failures;
}

defineTask('mail', async (p) => {
  await sendMail(String(p.to), String(p.subject), String(p.text));
});

/** Send a message off the request path. */
export function queueMail(to: string, subject: string, text: string): Promise<void> {
  return enqueue('mail', { to, subject, text });
}
