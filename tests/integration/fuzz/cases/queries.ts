// Bad query parameters of the GET routes (densities, sum rules, a result's bands, export,
// contributions, matrices, χ², comparison) and malformed or unknown ids in route paths.
import fc from 'fast-check'
import { sendJson, type Attempt, type Target } from '../harness'

interface QueryRoute {
  path: string
  /** Parameters that make the rest of the query valid. */
  valid: Record<string, string>
  /** Per parameter: values that must be refused. */
  bad: Record<string, string[]>
}

function queryRoutes(t: Target): QueryRoute[] {
  const result = `${t.base}/results/${t.resultId}`
  const cl = ['0', '100', '-5', 'abc', '1e309', 'NaN', '']
  const prescription = ['bogus', 'constructor', '__proto__', 'HESSIAN']
  const setIds = ['nope', 'a,b', '123e4567-e89b-12d3-a456-42661417400', `${t.setId}x`]
  return [
    {
      path: `${t.base}/sets/${t.setId}/densities`,
      valid: { q2: '100' },
      bad: {
        q2: ['abc', '-1', '0', '1e309', '', 'NaN', 'Infinity', '1e-300', '1e12'],
        flavours: ['7', 'x', '21,,99', 'uv,zz', 'constructor', '-7'],
        points: ['5', '401', '1.5', 'abc', '1e309'],
        prescription, cl, ratioTo: ['not-a-uuid', '1234']
      }
    },
    { path: `${t.base}/sets/${t.setId}/sum-rules`, valid: { q2: '100' }, bad: { q2: ['abc', '-1', '1e309', '1e12'], prescription, cl } },
    { path: result, valid: {}, bad: { prescription, cl } },
    { path: `${result}/export`, valid: { format: 'csv' }, bad: { format: ['pdf', '', 'CSV', 'constructor'], prescription, cl } },
    { path: `${result}/contributions`, valid: { bin: '1' }, bad: { bin: ['0', '-1', 'abc', '1.5', '99999', '1e309'], cl } },
    { path: `${result}/matrices`, valid: {}, bad: { cl } },
    { path: `${t.base}/studies/${t.studyId}/measurements/${t.measurementId}/chi2`, valid: {}, bad: { setIds } },
    {
      path: `${t.base}/studies/${t.studyId}/comparison`,
      valid: {},
      bad: { setIds, cl, replicasPerSet: ['1', '2001', 'abc', '2.5'], seed: ['-1', 'abc', '1e20', '1.5'] }
    }
  ]
}

export function queryParameters(t: Target): fc.Arbitrary<Attempt> {
  const routes = queryRoutes(t)
  return fc.constantFrom(...routes).chain((route) => {
    const names = Object.keys(route.bad)
    return fc.tuple(fc.constantFrom(...names), fc.nat(), fc.constantFrom('listed', 'junk', 'unstorable', 'twice'), fc.string({ maxLength: 12 }))
      .map(([name, k, how, junk]): Attempt => {
        const listed = route.bad[name]!
        // Junk is made invalid by its first character: no number, flavour, id or choice starts
        // with "z". A listed value stays invalid with a NUL or a lone surrogate after it (which
        // the URL carries as U+FFFD).
        const listedValue = listed[k % listed.length]!
        const value = how === 'junk' ? `z${junk}` : how === 'unstorable' ? `${listedValue}${k % 2 ? '\u0000' : '\uD800'}` : listedValue
        const query = new URLSearchParams(route.valid)
        query.set(name, value)
        if (how === 'twice') query.append(name, route.valid[name] ?? value)
        const url = `${route.path}?${query}`
        return { describe: `GET ${url}`, where: name, send: () => t.ws.viewer.client.get(url) }
      })
  })
}

/** Ids that name nothing: malformed, or well-formed uuids of no row. */
const strangerIds = fc.oneof(
  fc.uuid(),
  fc.string({ minLength: 1, maxLength: 60 }).filter(s => !/^\.+$/.test(s)),
  fc.constantFrom('00000000-0000-0000-0000-000000000000', 'null', 'undefined', '%', '1 OR 1=1', '\u0000', 'x'.repeat(500))
)

export function pathIds(t: Target): fc.Arbitrary<Attempt> {
  const routes: Array<[string, (id: string) => string, unknown?]> = [
    ['GET', id => `/api/workspaces/${id}`],
    ['GET', id => `/api/workspaces/${id}/sets`],
    ['GET', id => `${t.base}/sets/${id}`],
    ['GET', id => `${t.base}/sets/${id}/densities?q2=100`],
    ['GET', id => `${t.base}/sets/${id}/file`],
    ['GET', id => `${t.base}/sets/builds/${id}`],
    ['GET', id => `${t.base}/studies/${id}`],
    ['GET', id => `${t.base}/results/${id}`],
    ['GET', id => `${t.base}/results/${id}/export?format=csv`],
    ['GET', id => `${t.base}/studies/${t.studyId}/measurements/${id}`],
    ['GET', id => `/api/invitations/${id}`],
    ['PATCH', id => `${t.base}/sets/${id}`, { name: 'renamed by a stranger id' }],
    ['PATCH', id => `${t.base}/studies/${id}`, { name: 'renamed by a stranger id' }],
    ['PATCH', id => `${t.base}/members/${id}`, { role: 'viewer' }],
    ['DELETE', id => `${t.base}/sets/${id}`],
    ['DELETE', id => `${t.base}/studies/${id}`],
    ['DELETE', id => `${t.base}/results/${id}`],
    ['DELETE', id => `${t.base}/studies/${t.studyId}/measurements/${id}`],
    ['DELETE', id => `${t.base}/invitations/${id}`],
    ['POST', id => `${t.base}/results/${id}/cancel`, {}],
    ['POST', id => `${t.base}/results/${id}/submit`, { comment: '' }],
    ['POST', id => `${t.base}/studies/${id}/run`, {}],
    ['POST', id => `${t.base}/sets/builds/${id}/cancel`, {}],
    ['POST', id => `/api/invitations/${id}`, {}]
  ]
  return fc.tuple(fc.constantFrom(...routes), strangerIds).map(([[method, path, body], id]) => {
    const url = path(encodeURIComponent(id))
    return {
      describe: `${method} ${url.slice(0, 160)}`,
      where: null,
      send: () => (body === undefined ? t.ws.owner.client.request(method, url) : sendJson(t.ws.owner.client, method, url, body))
    }
  })
}
