import type { DB, Tx } from '../database/client'
import { tables as t } from '../database/client'
import type { NewAuditEvent } from '../database/schema'

/** An audit event as the callers give it. */
export type AuditEntry = Omit<NewAuditEvent, 'id' | 'createdAt'>

/** Append one audit event; pass the transaction to keep it atomic with the change it records. */
export async function audit(db: DB | Tx, event: AuditEntry) {
  await db.insert(t.auditEvents).values(event)
}
