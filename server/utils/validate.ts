import type { H3Event } from 'h3'
import type { z } from 'zod'
import { fieldErrors } from '../../shared/utils/account-schemas'
import { readJsonBody, type JsonBodyLimits } from './json-body'

function invalid(error: z.ZodError, where: string): never {
  throw createError({
    statusCode: 400,
    statusMessage: `Check the ${where}`,
    data: { fields: fieldErrors(error) }
  })
}

/**
 * The JSON body parsed by `schema`, or 400 with `data.fields` naming each bad field. The body
 * is read with limits (server/utils/json-body.ts): 413 past `limits.maxBytes` (default 1 MiB)
 * before it is all read, 400 when it is not JSON or nests deeper than 64 levels.
 */
export async function readValid<S extends z.ZodType>(event: H3Event, schema: S, limits?: JsonBodyLimits): Promise<z.infer<S>> {
  const body = await readJsonBody(event, limits)
  const parsed = schema.safeParse(body ?? {})
  if (!parsed.success) invalid(parsed.error, 'highlighted fields')
  return parsed.data
}

/** The query string parsed by `schema`, or 400. */
export function queryValid<S extends z.ZodType>(event: H3Event, schema: S): z.infer<S> {
  const parsed = schema.safeParse(getQuery(event))
  if (!parsed.success) invalid(parsed.error, 'query parameters')
  return parsed.data
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i

/** A router parameter that must be a uuid; anything else cannot exist, so 404 `what not found`. */
export function uuidParam(event: H3Event, name: string, what: string): string {
  const value = getRouterParam(event, name) ?? ''
  if (!UUID.test(value)) throw createError({ statusCode: 404, statusMessage: `${what} not found` })
  return value.toLowerCase()
}

/** The `token` router parameter of a mailed link; malformed tokens cannot exist, so 404. */
export function tokenParam(event: H3Event, what: string): string {
  const token = getRouterParam(event, 'token') ?? ''
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) throw createError({ statusCode: 404, statusMessage: `${what} not found` })
  return token
}
