/**
 * A small client of a Sheaf server for the command line: the server's address and an API token
 * (from --server / SHEAF_URL and SHEAF_TOKEN or --token-file; never a token on the command line,
 * where it would land in the shell's history), JSON and multipart requests, and the server's
 * located messages turned into one-line errors.
 */
import { readFileSync } from 'node:fs'
import { basename } from 'node:path'
import { BadInputError, UsageError } from './errors'
import { resolvePath, type CliIo } from './io'
import { stringOption, type ParsedArgs } from './args'

export interface RemoteOptions { server: string, token: string }

/** The options every remote verb accepts. */
export const REMOTE_OPTIONS = {
  server: { type: 'string' },
  'token-file': { type: 'string' }
} as const

export const REMOTE_HELP = `  --server <url>         the Sheaf server (default: $SHEAF_URL)
  --token-file <file>    a file holding the API token (default: $SHEAF_TOKEN)`

/** Server and token from the options and the environment; UsageError when one is missing. */
export function remoteOptions(verb: string, args: ParsedArgs, io: CliIo, env: NodeJS.ProcessEnv = process.env): RemoteOptions {
  const server = (stringOption(args, 'server') ?? env.SHEAF_URL ?? '').replace(/\/+$/, '')
  if (!/^https?:\/\/[^/]+/.test(server)) throw new UsageError(`${verb}: give the server as --server https://… or in SHEAF_URL.`)
  const tokenFile = stringOption(args, 'token-file')
  let token = env.SHEAF_TOKEN ?? ''
  if (tokenFile !== undefined) {
    try {
      token = readFileSync(resolvePath(io, tokenFile), 'utf8').trim()
    } catch (error) {
      throw new BadInputError(`${tokenFile}: ${(error as Error).message}`)
    }
  }
  if (!token) throw new UsageError(`${verb}: give an API token in SHEAF_TOKEN or --token-file (create one on the account page).`)
  return { server, token }
}

/** A request to the server; the parsed JSON (or text) answer, or BadInputError with the server's message. */
export async function remoteRequest<T = unknown>(o: RemoteOptions, method: string, path: string, body?: unknown): Promise<T> {
  const headers: Record<string, string> = { authorization: `Bearer ${o.token}` }
  let payload: BodyInit | undefined
  if (body instanceof FormData) payload = body
  else if (body !== undefined) {
    headers['content-type'] = 'application/json'
    payload = JSON.stringify(body)
  }
  let res: Response
  try {
    res = await fetch(o.server + path, { method, headers, body: payload })
  } catch (error) {
    throw new BadInputError(`cannot reach ${o.server}: ${(error as Error).message}`)
  }
  const text = await res.text()
  let parsed: unknown = text
  if ((res.headers.get('content-type') ?? '').includes('json')) {
    try {
      parsed = JSON.parse(text)
    } catch { /* keep the text */ }
  }
  if (!res.ok) {
    const p = parsed as { statusMessage?: string, message?: string, data?: { fields?: Record<string, string> } } | string
    const message = typeof p === 'string' ? p.slice(0, 300) : p.statusMessage ?? p.message ?? ''
    const fields = typeof p === 'object' && p.data?.fields ? ` (${Object.entries(p.data.fields).map(([k, v]) => `${k}: ${v}`).join('; ')})` : ''
    throw new BadInputError(`the server answered ${res.status} to ${method} ${path}: ${message}${fields}`)
  }
  return parsed as T
}

/** The token's workspace and role (GET /api/auth/token). */
export const tokenWorkspace = (o: RemoteOptions) => remoteRequest<{ workspaceId: string, role: string }>(o, 'GET', '/api/auth/token')

/** A file as a multipart part. */
export function filePart(io: CliIo, file: string): Blob {
  try {
    return new Blob([readFileSync(resolvePath(io, file))])
  } catch (error) {
    throw new BadInputError(`${file}: ${(error as Error).message}`)
  }
}

export const fileName = (file: string) => basename(file)
