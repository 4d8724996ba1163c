import 'server-only';
import type { Knex } from 'knex';

export interface AuditEntry {
  studyId?: number | null;
  actorId: number | null;
  action: string;
  targetTable?: string;
  targetId?: number | string;
  details?: Record<string, unknown>;
}

/** Appends one row to the audit trail, inside the caller's transaction so it lands with the change. */
export async function recordAudit(trx: Knex | Knex.Transaction, entry: AuditEntry): Promise<void> {
  await trx('audit_events').insert({
    study_id: entry.studyId ?? null,
    actor_id: entry.actorId,
    action: entry.action,
    target_table: entry.targetTable ?? null,
    target_id: entry.targetId === undefined ? null : String(entry.targetId),
    details: entry.details ? JSON.stringify(entry.details) : null,
  });
}
