import { randomBytes, scrypt, timingSafeEqual, type ScryptOptions } from 'node:crypto'

// scrypt with N = 2^15, r = 8, p = 1: about 32 MiB and tens of milliseconds per hash (common practice).
const PARAMS = { N: 2 ** 15, r: 8, p: 1, maxmem: 64 * 1024 * 1024 } satisfies ScryptOptions
const KEY_BYTES = 32

function derive(password: string, salt: Buffer, params: ScryptOptions): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    scrypt(password.normalize('NFKC'), salt, KEY_BYTES, params, (err, key) => (err ? reject(err) : resolve(key)))
  })
}

/** `scrypt$N$r$p$salt$key`, salt and key base64url; a new random salt per call. */
export async function hashPassword(password: string): Promise<string> {
  const salt = randomBytes(16)
  const key = await derive(password, salt, PARAMS)
  return ['scrypt', PARAMS.N, PARAMS.r, PARAMS.p, salt.toString('base64url'), key.toString('base64url')].join('$')
}

/** Constant-time comparison against a stored hash; false for any malformed hash. */
export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const [scheme, n, r, p, salt, key] = stored.split('$')
  if (scheme !== 'scrypt' || !salt || !key) return false
  const expected = Buffer.from(key, 'base64url')
  const actual = await derive(password, Buffer.from(salt, 'base64url'), {
    N: Number(n), r: Number(r), p: Number(p), maxmem: PARAMS.maxmem
  })
  return actual.length === expected.length && timingSafeEqual(actual, expected)
}

/** A valid hash of a random secret, so unknown e-mails cost as much time as known ones. */
let decoy: Promise<string> | undefined
export const decoyPasswordHash = () => (decoy ??= hashPassword(randomBytes(16).toString('hex')))
