// Bad account bodies (register, sign-in, reset, verify, profile, password change) and the other
// write bodies of a workspace (create, invite, role, review comments, run).
import { randomBytes } from 'node:crypto'
import fc from 'fast-check'
import { ApiClient } from '../../../support/http'
import { TEST_PASSWORD, uniqueEmail } from '../../../support/users'
import { badText, overlong, withUnstorable, words } from '../bad-values'
import { sendJson, type Attempt, type Target } from '../harness'

const badEmail = fc.oneof(
  withUnstorable(fc.constant('someone@tests.sheaf.test')),
  fc.constantFrom<unknown>('not-an-email', '@tests.sheaf.test', 'a@', '', 42, null),
  overlong(254).map(s => `${s}@tests.sheaf.test`)
)
const badName = fc.oneof(badText(120), fc.constantFrom('', '   '))
const badPassword = fc.oneof(
  fc.constantFrom<unknown>('short1!', 'onlyletterslong', '1234567890', 42, null),
  withUnstorable(fc.constant('gluon-fusion-7')),
  overlong(200)
)
/** Tokens of a mailed link: malformed, or well-formed and unknown. */
const badToken = fc.oneof(
  fc.constantFrom<unknown>('short', 'bad chars!!!!!!!!!!!!!!!!!!', 42, 'x'.repeat(101)),
  withUnstorable(fc.constant('A'.repeat(43))),
  fc.nat().map(() => randomBytes(32).toString('base64url'))
)

type Body = Record<string, unknown>

/** A valid body with one field replaced by a bad value; the answer must name that field. */
function oneBadField(valid: () => Body, fields: Record<string, fc.Arbitrary<unknown>>) {
  return fc.constantFrom(...Object.keys(fields)).chain(field =>
    fc.oneof(fields[field]!, fc.constant(undefined)).map(value => ({ body: { ...valid(), [field]: value }, field })))
}

export function accountBodies(t: Target): fc.Arbitrary<Attempt> {
  const anonymous = (describe: string, path: string, body: Body, where: string): Attempt =>
    ({ describe, where, send: () => sendJson(new ApiClient(), 'POST', path, body) })
  const register = oneBadField(() => ({ email: uniqueEmail('fuzz'), name: 'Fuzz Person', password: 'gluon-fusion-7' }), { email: badEmail, name: badName, password: badPassword })
  const signin = oneBadField(() => ({ email: t.account.email, password: 'not-the-password-1' }), { email: badEmail, password: fc.oneof(fc.constantFrom<unknown>('', 42), overlong(200), withUnstorable(fc.constant('pass'))) })
  const reset = oneBadField(() => ({ token: randomBytes(32).toString('base64url'), password: 'gluon-fusion-7' }), { token: badToken, password: badPassword })
  const profile = oneBadField(() => ({ name: 'Fuzz Renamed' }), { name: badName })
  return fc.oneof(
    register.map(({ body, field }) => anonymous(`register with a bad ${field}: ${JSON.stringify(body[field])?.slice(0, 60)}`, '/api/auth/register', body, field)),
    signin.map(({ body, field }) => anonymous(`sign in with a bad ${field}`, '/api/auth/signin', body, field)),
    badEmail.map(email => anonymous(`ask for a reset of ${JSON.stringify(email)?.slice(0, 60)}`, '/api/auth/reset-request', { email }, 'email')),
    badEmail.map(email => anonymous(`ask to resend to ${JSON.stringify(email)?.slice(0, 60)}`, '/api/auth/verify-resend', { email }, 'email')),
    badToken.map(token => anonymous(`verify with the token ${JSON.stringify(token)?.slice(0, 60)}`, '/api/auth/verify', { token }, 'token')),
    reset.map(({ body, field }) => anonymous(`reset with a bad ${field}`, '/api/auth/reset', body, field)),
    profile.map(({ body }): Attempt => ({
      describe: `rename the account to ${JSON.stringify(body.name)?.slice(0, 60)}`, where: 'name',
      send: () => sendJson(t.account.client, 'PATCH', '/api/auth/me', body)
    })),
    fc.oneof(
      badPassword.map(newPassword => ({ body: { currentPassword: TEST_PASSWORD, newPassword }, field: 'newPassword' })),
      fc.oneof(fc.constantFrom<unknown>('', 42, 'wrong-password-1'), overlong(200), withUnstorable(fc.constant(TEST_PASSWORD)))
        .map(currentPassword => ({ body: { currentPassword, newPassword: 'gluon-fusion-8' }, field: 'currentPassword' }))
    ).map(({ body, field }): Attempt => ({
      describe: `change the password with a bad ${field}`, where: field,
      send: () => sendJson(t.account.client, 'POST', '/api/auth/password', body)
    }))
  )
}

export function workspaceBodies(t: Target): fc.Arbitrary<Attempt> {
  const owner = t.ws.owner.client
  const analyst = t.ws.analyst.client
  const result = `${t.base}/results/${t.resultId}`
  const badComment = fc.oneof(overlong(4000), withUnstorable(words), fc.constantFrom<unknown>(42, [], {}))
  return fc.oneof(
    fc.oneof(badText(120), fc.constantFrom('', ' a')).map((name): Attempt => ({
      describe: `create a workspace named ${JSON.stringify(name)?.slice(0, 60)}`, where: 'name', send: () => sendJson(owner, 'POST', '/api/workspaces', { name })
    })),
    oneBadField(() => ({ email: uniqueEmail('invitee'), role: 'analyst' }), { email: badEmail, role: fc.constantFrom<unknown>('admin', 'constructor', '', 3) })
      .map(({ body, field }): Attempt => ({ describe: `invite with a bad ${field}`, where: field, send: () => sendJson(owner, 'POST', `${t.base}/members`, body) })),
    fc.constantFrom<unknown>('admin', 'Owner', '__proto__', null, undefined).map((role): Attempt => ({
      describe: `make the analyst ${JSON.stringify(role)}`, where: 'role', send: () => sendJson(owner, 'PATCH', `${t.base}/members/${t.ws.analyst.id}`, { role })
    })),
    fc.tuple(fc.constantFrom('submit', 'return', 'approve'), badComment).map(([step, comment]): Attempt => ({
      describe: `${step} with the comment ${JSON.stringify(comment)?.slice(0, 60)}`, where: 'comment',
      send: () => sendJson(step === 'submit' ? analyst : owner, 'POST', `${result}/${step}`, { comment })
    })),
    fc.constant<Attempt>({ describe: 'return without a comment', where: 'comment', send: () => sendJson(owner, 'POST', `${result}/return`, {}) }),
    fc.oneof(fc.constantFrom<unknown>([], ['x'], 'all', [42]), fc.uuid().map(id => [id])).map((setIds): Attempt => ({
      describe: `run the study on ${JSON.stringify(setIds)}`, where: 'setIds', send: () => sendJson(analyst, 'POST', `${t.base}/studies/${t.studyId}/run`, { setIds })
    }))
  )
}
