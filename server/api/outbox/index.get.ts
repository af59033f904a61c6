import { arrayContains, desc } from 'drizzle-orm'
import { tables as t } from '../../database/client'
import { extractLinks } from '../../domain/mail/mime'
import { fail } from '../../domain/errors'

// Exists only while the local mail fake is in use (SHEAF_MAIL_FAKE=1); 404 in production.
// With the operator's key (x-outbox-key) every message; for a signed-in user without it, only the
// mail addressed to them; otherwise 401 (server/utils/outbox-access.ts).
export default defineEventHandler(async (event) => {
  if (!useSettings().mailFake) fail(404, 'Page not found')
  const reader = requireOutboxReader(event)
  const rows = await useDB()
    .select({ id: t.mailOutbox.id, from: t.mailOutbox.mailFrom, to: t.mailOutbox.mailTo, subject: t.mailOutbox.subject, text: t.mailOutbox.textBody, receivedAt: t.mailOutbox.receivedAt })
    .from(t.mailOutbox)
    .where(reader.all ? undefined : arrayContains(t.mailOutbox.mailTo, [reader.email]))
    .orderBy(desc(t.mailOutbox.receivedAt))
    .limit(100)
  return { everything: reader.all, messages: rows.map(m => ({ ...m, links: extractLinks(m.text) })) }
})
