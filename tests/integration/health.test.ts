import { describe, expect, it } from 'vitest'
import { ApiClient } from '../support/http'

describe('GET /api/health', () => {
  it('answers ok for the database and the queue without a session', async () => {
    const res = await new ApiClient(undefined, null).get('/api/health')
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/application\/json/)
    expect(res.body).toEqual({ ok: true, database: 'ok', queue: 'ok' })
  })
})
