import type { Db } from './db'

export interface AuditEntry {
  workshopId: number | null
  userId: number | null
  action: string
  entity: string
  entityId?: number | null
  detail?: Record<string, unknown>
}

// Written inside the caller's transaction where there is one, so a failed action leaves no trace.
export function recordAudit(db: Pick<Db, 'insert'>, entry: AuditEntry) {
  db.insert(tables.auditEvents).values({
    workshopId: entry.workshopId,
    userId: entry.userId,
    action: entry.action,
    entity: entry.entity,
    entityId: entry.entityId ?? null,
    detail: entry.detail ?? {},
  }).run()
}
