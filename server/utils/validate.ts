import type { H3Event } from 'h3'
import type { z } from 'zod'
import { fieldErrors } from '../../shared/utils/account-schemas'

function invalid(error: z.ZodError, where: string): never {
  throw createError({
    statusCode: 400,
    statusMessage: `Check the ${where}`,
    data: { fields: fieldErrors(error) }
  })
}

/** The JSON body parsed by `schema`, or 400 with `data.fields` naming each bad field. */
export async function readValid<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.infer<S>> {
  const body = await readBody(event).catch(() => {
    throw createError({ statusCode: 400, statusMessage: 'The request body is not valid JSON' })
  })
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
