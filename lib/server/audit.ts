import type { Knex } from 'knex';
import { db } from './db';

export interface AuditEntry {
  actorId: number | null;
  action: string;
  targetType?: string;
  targetId?: number | null;
  details?: Record<string, unknown>;
  ip?: string;
}

/** One row in audit_log; pass the transaction so the entry commits (or not) with the change. */
export async function audit(entry: AuditEntry, trx: Knex | Knex.Transaction = db()): Promise<void> {
  await trx('audit_log').insert({
    actor_id: entry.actorId,
    action: entry.action,
    target_type: entry.targetType ?? null,
    target_id: entry.targetId ?? null,
    details: entry.details ? JSON.stringify(entry.details) : null,
    ip: entry.ip ?? null,
  });
}
