import { readdirSync, readFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { describe, expect, it } from 'vitest'
import { openApiDocument } from '../../../server/domain/openapi/document'
import { API_ROUTES } from '../../../server/domain/openapi/routes'

// The description must list exactly the route files under server/api, each with the schema the
// route itself hands to readValid / queryValid.
const API_DIR = join(__dirname, '../../../server/api')

function routeFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap(e => e.isDirectory() ? routeFiles(join(dir, e.name)) : [join(dir, e.name)])
}

/** server/api/workspaces/[wid]/sets/index.get.ts → { method: 'get', path: '/api/workspaces/{wid}/sets' } */
function routeOf(file: string) {
  const rel = relative(API_DIR, file).replace(/\.ts$/, '')
  const match = /^(.*)\.(get|post|patch|put|delete)$/.exec(rel)
  if (!match) throw new Error(`route file without a method in its name: ${rel}`)
  const path = ('/api/' + match[1]!).replace(/\/index$/, '').replace(/\[(\w+)\]/g, '{$1}')
  return { method: match[2]!, path, source: readFileSync(file, 'utf8'), file: rel }
}

const files = routeFiles(API_DIR).map(routeOf)
const key = (r: { method: string, path: string }) => `${r.method.toUpperCase()} ${r.path}`

describe('OpenAPI description against the route files', () => {
  it('lists every route file, and nothing else', () => {
    const described = API_ROUTES.map(key).sort()
    const onDisk = files.map(key).sort()
    expect(onDisk.filter(k => !described.includes(k)), 'route files missing from server/domain/openapi/routes.ts').toEqual([])
    expect(described.filter(k => !onDisk.includes(k)), 'described routes without a file').toEqual([])
    expect(new Set(described).size).toBe(described.length)
  })

  it.each(files.map(f => [f.file, f] as const))('%s names the schema the route validates with', (_, f) => {
    const route = API_ROUTES.find(r => key(r) === key(f))!
    const body = /readValid\(event, (\w+)/.exec(f.source)?.[1]
    const query = /queryValid\(event, (\w+)/.exec(f.source)?.[1]
    // The measurement upload reads JSON through readMeasurementUpload, which validates with measurementJsonSchema.
    expect(route.body).toBe(body ?? (/readMeasurementUpload\(event\)/.test(f.source) ? 'measurementJsonSchema' : undefined))
    expect(route.query).toBe(query)
  })

  it('builds a 3.1 document with every path, operation and body schema', () => {
    const doc = openApiDocument() as { openapi: string, paths: Record<string, Record<string, { parameters: Array<{ in: string, name: string }> }>>, components: { schemas: Record<string, unknown> } }
    expect(doc.openapi).toBe('3.1.0')
    const ops = Object.entries(doc.paths).flatMap(([path, ops]) => Object.keys(ops).map(method => `${method.toUpperCase()} ${path}`))
    expect(ops.sort()).toEqual(files.map(key).sort())
    for (const r of API_ROUTES.filter(r => r.body)) expect(doc.components.schemas[r.body!], r.body).toMatchObject({ type: 'object' })
    // Every path parameter of the template is declared.
    for (const [path, byMethod] of Object.entries(doc.paths)) {
      const names = [...path.matchAll(/\{(\w+)\}/g)].map(m => m[1])
      for (const op of Object.values(byMethod)) expect(op.parameters.filter(p => p.in === 'path').map(p => p.name)).toEqual(names)
    }
  })
})
