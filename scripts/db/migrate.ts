/**
 * Runs the Knex migrations, then (with --seed) the demo seed — only into an empty database, so a
 * second `npm start` never overwrites anyone's work.
 */
import knexFactory from 'knex';
import { knexConfig } from '../../knexfile';
import { seed } from '../../db/seeds/01_demo';

async function main() {
  const knex = knexFactory(knexConfig());
  try {
    const [batch, names] = await knex.migrate.latest();
    console.log(names.length ? `  migrations applied (batch ${batch}): ${names.join(', ')}` : '  schema is up to date');
    if (process.argv.includes('--seed')) {
      const row = await knex('users').count<{ n: number }[]>({ n: '*' }).first();
      if (Number(row?.n ?? 0) === 0) {
        await seed(knex);
        console.log('  demo data seeded');
      } else {
        console.log('  database already holds data; demo seed skipped');
      }
    }
  } finally {
    await knex.destroy();
  }
}

main().catch((err: unknown) => {
  // mysql2 errors can embed a whole statement; print only the message's first line.
  const msg = err instanceof Error ? err.message.split('\n')[0].slice(0, 300) : String(err);
  console.error(`migration failed: ${msg}`);
  process.exit(1);
});
