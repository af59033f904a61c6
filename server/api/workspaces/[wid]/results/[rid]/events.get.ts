import { eq } from 'drizzle-orm'
import { tables as t } from '../../../../../database/client'
import { progressOf } from '../../../../../domain/studies/studies'

const POLL_MS = 300
const MAX_MS = 15 * 60_000

// Server-sent events for the live bar: a `progress` event (as GET …/progress) whenever the
// state or the members done change, until the result has ended (then the stream closes).
export default defineEventHandler(async (event) => {
  const { result } = await requireResult(event, 'viewer')
  const resultId = result.id
  const stream = createEventStream(event)
  const started = Date.now()
  let last = ''
  let timer: ReturnType<typeof setTimeout> | undefined
  const tick = async () => {
    const [row] = await useDB().select().from(t.results).where(eq(t.results.id, resultId))
    const view = row ? progressOf(row) : null
    const text = JSON.stringify(view)
    if (text !== last) {
      last = text
      await stream.push({ event: 'progress', data: text })
    }
    if (!row || ['done', 'failed', 'cancelled'].includes(row.state) || Date.now() - started > MAX_MS) await stream.close()
    else timer = setTimeout(() => void tick().catch(() => stream.close()), POLL_MS)
  }
  stream.onClosed(() => clearTimeout(timer))
  void tick().catch(() => stream.close())
  return stream.send()
})
