/**
 * `npm run bench`: runs every tests/bench/*.bench.ts module in name order and prints its figures.
 * Each module exports `default async function (): Promise<void>` that prints its own lines.
 * `npm run bench -- NAME` runs only the modules whose file name contains NAME.
 */
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const filter = process.argv[2];
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts') && (!filter || f.includes(filter)))
  .sort();

for (const f of files) {
  console.log(`\n== ${f.replace('.bench.ts', '')} ==`);
  const mod = (await import(pathToFileURL(join(here, f)).href)) as { default: () => Promise<void> };
  await mod.default();
}
