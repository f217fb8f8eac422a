/**
 * `npm run bench`: runs every tests/bench/*.bench.ts module in name order and prints its figures.
 * Each module exports `default async function (): Promise<void>` that prints its own lines.
 * `npm run bench -- NAME` runs only the modules whose file name contains NAME.
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

async function main() {
  const here = __dirname;
  const filter = process.argv[2];
  const files = readdirSync(here)
    .filter((f) => f.endsWith('.bench.ts') && (!filter || f.includes(filter)))
    .sort();
  for (const f of files) {
    console.log(`\n== ${f.replace('.bench.ts', '')} ==`);
    const mod = (await import(pathToFileURL(join(here, f)).href)) as { default: () => Promise<void> | { default: () => Promise<void> } };
    const fn = typeof mod.default === 'function' ? mod.default : (mod.default as { default: () => Promise<void> }).default;
    await fn();
  }
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
