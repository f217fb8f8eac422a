import { afterAll, describe, expect, it } from 'vitest';
import { GET } from '../../app/api/health/route';
import { closeDb } from '../../lib/server/db';

afterAll(closeDb);

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
