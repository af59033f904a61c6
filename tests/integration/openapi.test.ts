import { describe, expect, it } from 'vitest'
import { ApiClient } from '../support/http'
import { testEnv } from '../support/env'

describe('OpenAPI description and reference page', () => {
  it('serves an OpenAPI 3.1 document without sign-in', async () => {
    const res = await new ApiClient().get('/api/openapi.json')
    expect(res.status).toBe(200)
    expect(res.body.openapi).toBe('3.1.0')
    expect(res.body.paths['/api/auth/tokens'].post.requestBody.content['application/json'].schema.$ref).toBe('#/components/schemas/apiTokenCreateSchema')
    expect(res.body.components.securitySchemes.bearer).toMatchObject({ type: 'http', scheme: 'bearer' })
  })

  it('renders every route of the description on the API reference page', async () => {
    const doc = (await new ApiClient().get('/api/openapi.json')).body as { paths: Record<string, Record<string, unknown>> }
    const operations = Object.entries(doc.paths).flatMap(([path, ops]) => Object.keys(ops).map(method => ({ path, method })))
    const res = await fetch(`${testEnv().appUrl}/api-reference`)
    expect(res.status).toBe(200)
    const html = await res.text()
    expect(html.match(/data-testid="api-route"/g)?.length).toBe(operations.length)
    for (const { path } of operations) expect(html).toContain(path.replace(/&/g, '&amp;'))
  })
})
