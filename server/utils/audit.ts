import type { DB } from '../database/client'
import { tables as t } from '../database/client'
import type { NewAuditEvent } from '../database/schema'

type Tx = Parameters<Parameters<DB['transaction']>[0]>[0]

/** Append one audit event; pass a transaction to keep it atomic with the change it records. */
export async function audit(event: Omit<NewAuditEvent, 'id' | 'createdAt'>, db: DB | Tx = useDB()) {
  await db.insert(t.auditEvents).values(event)
}
