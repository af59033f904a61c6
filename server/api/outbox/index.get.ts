import { desc } from 'drizzle-orm'
import { tables as t } from '../../database/client'
import { extractLinks } from '../../domain/mail/mime'
import { fail } from '../../domain/errors'

// Exists only while the local mail fake is in use (SHEAF_MAIL_FAKE=1); 404 in production.
export default defineEventHandler(async () => {
  if (!useSettings().mailFake) fail(404, 'Page not found')
  const rows = await useDB()
    .select({ id: t.mailOutbox.id, from: t.mailOutbox.mailFrom, to: t.mailOutbox.mailTo, subject: t.mailOutbox.subject, text: t.mailOutbox.textBody, receivedAt: t.mailOutbox.receivedAt })
    .from(t.mailOutbox)
    .orderBy(desc(t.mailOutbox.receivedAt))
    .limit(100)
  return { messages: rows.map(m => ({ ...m, links: extractLinks(m.text) })) }
})
