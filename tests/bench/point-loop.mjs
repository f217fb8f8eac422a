// The machine's own ceiling for the queue bench (queue.bench.ts): the sweep's points run back to back in the
// worker's built task thread (dist/worker/thread.mjs), in a plain process with no queue, no Redis and no
// database. Started once alone and twice at once, it shows how much two busy cores give on this machine for
// this work, before any queue overhead. Input: a JSON file { warm: params[], points: params[], settings,
// measured }. Output: one JSON line { seconds, points }.
import { readFileSync } from 'node:fs';
import { Worker } from 'node:worker_threads';

const [threadFile, inputFile] = process.argv.slice(2);
const input = JSON.parse(readFileSync(inputFile, 'utf8'));
const thread = new Worker(new URL(`file://${threadFile}`), { resourceLimits: { maxOldGenerationSizeMb: 1536 } });
let seq = 0;
const run = (params, measured) =>
  new Promise((resolve, reject) => {
    const id = ++seq;
    const on = (m) => {
      if (m.id !== id || m.type === 'progress') return;
      thread.off('message', on);
      if (m.type === 'done') resolve(m.result);
      else reject(new Error(m.error.message));
    };
    thread.on('message', on);
    thread.postMessage({ id, kind: 'point', input: { params, dataset: 1, measured, settings: input.settings } });
  });
await run(input.warm[0], input.measured);
for (const p of input.warm.slice(1)) await run(p);
const t0 = performance.now();
for (const p of input.points) await run(p);
const seconds = (performance.now() - t0) / 1000;
await thread.terminate();
console.log(JSON.stringify({ seconds, points: input.points.length }));
