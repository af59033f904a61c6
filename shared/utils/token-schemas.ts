import { z } from 'zod'
import { roleSchema } from './account-schemas'
import { storableString } from './storable'

// Personal API tokens: the creation form and its route share this schema.

/** Longest lifetime of a personal API token, days (our number: one year). */
export const API_TOKEN_MAX_DAYS = 365

export const apiTokenCreateSchema = z.object({
  name: storableString().trim().min(1, 'Name the token').max(80, 'Use at most 80 characters'),
  workspaceId: z.uuid({ error: 'Choose a workspace' }),
  role: roleSchema,
  expiresInDays: z.number({ error: 'Enter a number of days' }).int('Use whole days')
    .min(1, 'At least 1 day').max(API_TOKEN_MAX_DAYS, `At most ${API_TOKEN_MAX_DAYS} days`)
}).strict()

export type ApiTokenCreate = z.infer<typeof apiTokenCreateSchema>

/** A token as the account page lists it (never its secret or hash). */
export const apiTokenPublicSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  workspaceId: z.uuid(),
  workspaceName: z.string(),
  role: roleSchema,
  prefix: z.string(),
  createdAt: z.iso.datetime({ offset: true }),
  expiresAt: z.iso.datetime({ offset: true }),
  lastUsedAt: z.iso.datetime({ offset: true }).nullable(),
  revokedAt: z.iso.datetime({ offset: true }).nullable()
})
export type ApiTokenPublic = z.infer<typeof apiTokenPublicSchema>
