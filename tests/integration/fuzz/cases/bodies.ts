// Whole request bodies that are not the object a JSON route expects: other JSON values, random
// JSON, and text that is not JSON at all.
import fc from 'fast-check'
import { rawRequest, type Attempt, type Target } from '../harness'

/** Bodies no JSON route of Sheaf accepts in place of its object. */
const notTheObject = fc.oneof(
  fc.constantFrom('[]', '"text"', '42', 'true', '{', '{"name":', '[1,2', 'name=x&csv=y', '\u0000', '{"a":1}{"b":2}'),
  // Random JSON: no route whose required fields it could fill by chance is in the list below.
  fc.json({ maxDepth: 4 })
)

export function wholeBodies(t: Target): fc.Arbitrary<Attempt> {
  const { analyst, owner, viewer } = t.ws
  const routes: Array<[string, string, typeof analyst.client]> = [
    ['POST', `${t.base}/studies`, analyst.client],
    ['PATCH', `${t.base}/sets/${t.setId}`, analyst.client],
    ['POST', `${t.base}/sets/builds`, analyst.client],
    ['POST', `${t.base}/studies/${t.studyId}/measurements`, analyst.client],
    ['POST', `${t.base}/members`, owner.client],
    ['PATCH', `${t.base}/members/${viewer.id}`, owner.client],
    ['POST', '/api/workspaces', owner.client],
    ['POST', `${t.base}/results/${t.resultId}/return`, owner.client],
    ['POST', '/api/auth/register', t.account.client],
    ['POST', '/api/auth/signin', t.account.client],
    ['POST', '/api/auth/verify', t.account.client],
    ['POST', '/api/auth/reset', t.account.client],
    ['POST', '/api/auth/reset-request', t.account.client],
    ['POST', '/api/auth/verify-resend', t.account.client],
    ['PATCH', '/api/auth/me', t.account.client],
    ['POST', '/api/auth/password', t.account.client]
  ]
  return fc.tuple(fc.constantFrom(...routes), notTheObject).map(([[method, path, client], body]) => ({
    describe: `${method} ${path} with the body ${JSON.stringify(body).slice(0, 80)}`,
    where: null,
    send: () => rawRequest(client, method, path, body)
  }))
}
