/**
 * The export job, run in its own process so a large cut never blocks the server's event loop:
 *   node --import tsx lib/server/export-worker.ts   (stdin: {"params": …, "format": "xyz"}; stdout: file bytes)
 * A child process (rather than worker_threads) because the Next.js server bundles lib/ into its own
 * chunks; a child loads the TypeScript sources directly through tsx, the same way in `next dev`,
 * `next start` and the tests. Exit code 0 = bytes on stdout; 2 = bad params (message on stderr).
 */
import type { Structure } from '../structure/types';
import { writeCif, writeExtxyz, writeJson, writeXyz } from '../formats';
import { ENGINE_VERSION } from '../version';

type Generate = (params: unknown) => Structure;

async function loadGenerate(): Promise<Generate> {
  const override = process.env.TAUFORGE_EXPORT_GENERATOR; // tests: a module exporting generate()
  const candidates = override ? [override] : ['../generate'];
  for (const spec of candidates) {
    try {
      const m = (await import(spec)) as { generate?: Generate };
      if (typeof m.generate === 'function') return m.generate;
    } catch (e) {
      if (override) throw e;
    }
  }
  // Until lib/generate.ts lands: the Fibonacci chain engine directly.
  const { fibonacciChain } = await import('../tiling/fibonacci');
  return (params) => {
    const { family, ...rest } = params as { family: string };
    if (family !== 'fibonacci') throw new Error(`the ${family} engine is not available for exports yet`);
    return fibonacciChain(rest as Parameters<typeof fibonacciChain>[0]);
  };
}

function write(s: Structure, format: string): string {
  switch (format) {
    case 'xyz':
      return writeXyz(s);
    case 'extxyz':
      return writeExtxyz(s);
    case 'cif':
      return writeCif(s);
    case 'json':
      return writeJson(s);
    default:
      throw new Error(`unknown format ${format}`);
  }
}

async function main() {
  const chunks: Buffer[] = [];
  for await (const c of process.stdin) chunks.push(c as Buffer);
  const job = JSON.parse(Buffer.concat(chunks).toString('utf8')) as { params: unknown; format: string };
  const generate = await loadGenerate();
  let s: Structure;
  try {
    s = generate(job.params);
  } catch (e) {
    process.stderr.write(e instanceof Error ? e.message : String(e));
    process.exit(2);
  }
  s.provenance = { params: job.params, engine: ENGINE_VERSION };
  const text = write(s, job.format);
  process.stdout.write(text, () => process.exit(0));
}

main().catch((e: unknown) => {
  process.stderr.write(e instanceof Error ? e.message : String(e));
  process.exit(1);
});
