// The OpenAPI 3.1 description of the API, generated from the route registry (routes.ts) and the
// zod schemas the routes validate with (zod 4's z.toJSONSchema, draft 2020-12, which is OpenAPI
// 3.1's schema dialect). Request schemas are given as the routes accept them (io: 'input').
import { z } from 'zod'
import { API_ROUTES, API_SCHEMAS, type ApiRoute, type SchemaName } from './routes'

type Json = Record<string, unknown>

const schemaOf = (name: SchemaName): Json => {
  const schema = API_SCHEMAS[name] as unknown as z.ZodType
  const json = z.toJSONSchema(schema, { target: 'draft-2020-12', io: 'input', unrepresentable: 'any' }) as Json
  delete json.$schema
  return json
}

const PARAM_TEXT: Record<string, string> = {
  wid: 'Workspace id (uuid)', sid: 'Error-set id (uuid)', bid: 'Set-build id (uuid)', id: 'Study id (uuid)',
  rid: 'Result id (uuid)', mid: 'Measurement id (uuid)', uid: 'User id (uuid)', iid: 'Invitation id (uuid)',
  tid: 'API token id (uuid)', token: 'The token of a mailed link'
}

function parameters(route: ApiRoute): Json[] {
  const out: Json[] = [...route.path.matchAll(/\{(\w+)\}/g)].map(([, name]) => ({
    name, in: 'path', required: true, description: PARAM_TEXT[name!] ?? name,
    schema: name === 'token' ? { type: 'string' } : { type: 'string', format: 'uuid' }
  }))
  if (route.query) {
    const query = schemaOf(route.query) as { properties?: Record<string, Json>, required?: string[] }
    for (const [name, schema] of Object.entries(query.properties ?? {})) {
      out.push({ name, in: 'query', required: query.required?.includes(name) ?? false, schema })
    }
  }
  return out
}

function requestBody(route: ApiRoute): Json | undefined {
  const content: Json = {}
  if (route.body) content['application/json'] = { schema: { $ref: `#/components/schemas/${route.body}` } }
  if (route.multipart) {
    content['multipart/form-data'] = {
      schema: {
        type: 'object',
        properties: Object.fromEntries(route.multipart.map(f => [f.name, {
          description: f.description, ...(f.type === 'file' ? { type: 'string', contentMediaType: 'application/octet-stream' } : { type: 'string' })
        }])),
        required: route.multipart.filter(f => f.required).map(f => f.name)
      }
    }
  }
  return Object.keys(content).length ? { required: true, content } : undefined
}

const ACCESS_TEXT: Record<ApiRoute['access'], string> = {
  public: 'No sign-in needed.',
  session: 'Browser session only (an API token gets 403).',
  workspace: 'Browser session or an API token of this workspace.',
  token: 'API token only.',
  outbox: 'The mail fake\'s operator key (x-outbox-key) or a signed-in user (own mail only).'
}

function security(route: ApiRoute): Json[] {
  if (route.access === 'public') return []
  if (route.access === 'session' || route.access === 'outbox') return [{ session: [] }]
  if (route.access === 'token') return [{ bearer: [] }]
  return [{ session: [] }, { bearer: [] }]
}

function operation(route: ApiRoute): Json {
  const role = route.minRole ? ` Needs the ${route.minRole} role or higher (an API token: the lower of its own role and the user's).` : ''
  const success: Json = { description: 'Success' }
  if (route.produces) success.content = Object.fromEntries(route.produces.map(type => [type, {}]))
  return {
    operationId: `${route.method}${route.path.replace(/^\/api/, '').replace(/\{(\w+)\}/g, (_, n: string) => `By${n[0]!.toUpperCase()}${n.slice(1)}`).replace(/[^A-Za-z0-9]+(\w)?/g, (_, c?: string) => (c ?? '').toUpperCase())}`,
    summary: route.summary,
    description: `${ACCESS_TEXT[route.access]}${role}`,
    tags: [route.tag],
    parameters: parameters(route),
    ...(requestBody(route) ? { requestBody: requestBody(route) } : {}),
    ...(route.access === 'public' ? { security: [] } : { security: security(route) }),
    ...(route.minRole ? { 'x-min-role': route.minRole } : {}),
    responses: {
      [String(route.status ?? 200)]: success,
      400: { description: 'Bad input; data.fields or data.issues say what and where' },
      ...(route.access !== 'public' ? { 401: { description: 'Not signed in, or the API token is not valid' }, 403: { description: 'Role too low, or not allowed with this kind of credential' } } : {}),
      ...(route.access === 'workspace' ? { 404: { description: 'Not found, or in another workspace' } } : {}),
      429: { description: 'Throttled; Retry-After says how long to wait' }
    }
  }
}

/** The whole OpenAPI 3.1 document. */
export function openApiDocument(serverUrl = '/'): Json {
  const paths: Record<string, Json> = {}
  for (const route of API_ROUTES) (paths[route.path] ??= {})[route.method] = operation(route)
  const names = [...new Set(API_ROUTES.flatMap(r => r.body ? [r.body] : []))].sort()
  return {
    openapi: '3.1.0',
    info: {
      title: 'Sheaf API',
      version: '1',
      description: 'PDF uncertainties on leading-order cross-sections. Leading-order predictions are rough: '
        + 'treat their bands as an estimate. Authenticate with a browser session or, for scripts, with '
        + '`Authorization: Bearer <API token>` (create tokens on the account page).'
    },
    servers: [{ url: serverUrl }],
    jsonSchemaDialect: 'https://json-schema.org/draft/2020-12/schema',
    components: {
      securitySchemes: {
        bearer: { type: 'http', scheme: 'bearer', description: 'A personal API token (sheaf_pat_…), for one workspace and role' },
        session: { type: 'apiKey', in: 'cookie', name: 'sheaf_session', description: 'Browser session; state-changing requests also need an Origin header of this site' }
      },
      schemas: Object.fromEntries(names.map(name => [name, schemaOf(name)]))
    },
    paths
  }
}
