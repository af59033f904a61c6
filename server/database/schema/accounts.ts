// Accounts, workspaces and their members, mailed tokens, the mail fake's outbox and the audit log.
import { relations, sql } from 'drizzle-orm'
import { index, jsonb, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { timestamps } from './columns'

// Role order matters: viewer < analyst < owner (see shared/utils/roles.ts).
export const roleEnum = pgEnum('role', ['viewer', 'analyst', 'owner'])
export const tokenPurposeEnum = pgEnum('token_purpose', ['verify_email', 'reset_password'])

export const users = pgTable('users', {
  id: uuid().primaryKey().defaultRandom(),
  email: text().notNull(),
  name: text().notNull(),
  passwordHash: text().notNull(),
  emailVerifiedAt: timestamp({ withTimezone: true }),
  ...timestamps()
}, t => [uniqueIndex('users_email_idx').on(t.email)])

// lucia's session table: the adapter reads id, userId and expiresAt.
export const sessions = pgTable('sessions', {
  id: text().primaryKey(),
  userId: uuid().notNull().references(() => users.id, { onDelete: 'cascade' }),
  expiresAt: timestamp({ withTimezone: true, mode: 'date' }).notNull()
}, t => [index('sessions_user_id_idx').on(t.userId)])

export const workspaces = pgTable('workspaces', {
  id: uuid().primaryKey().defaultRandom(),
  name: text().notNull(),
  createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  ...timestamps()
})

export const memberships = pgTable('memberships', {
  workspaceId: uuid().notNull().references(() => workspaces.id, { onDelete: 'cascade' }),
  userId: uuid().notNull().references(() => users.id, { onDelete: 'cascade' }),
  role: roleEnum().notNull(),
  ...timestamps()
}, t => [
  primaryKey({ columns: [t.workspaceId, t.userId] }),
  index('memberships_user_id_idx').on(t.userId)
])

export const invitations = pgTable('invitations', {
  id: uuid().primaryKey().defaultRandom(),
  workspaceId: uuid().notNull().references(() => workspaces.id, { onDelete: 'cascade' }),
  email: text().notNull(),
  role: roleEnum().notNull(),
  tokenHash: text().notNull(),
  invitedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  expiresAt: timestamp({ withTimezone: true }).notNull(),
  acceptedAt: timestamp({ withTimezone: true }),
  acceptedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  revokedAt: timestamp({ withTimezone: true }),
  ...timestamps()
}, t => [
  uniqueIndex('invitations_token_hash_idx').on(t.tokenHash),
  index('invitations_workspace_id_idx').on(t.workspaceId)
])

// E-mail verification and password-reset tokens: only the SHA-256 of the token is stored.
export const authTokens = pgTable('auth_tokens', {
  id: uuid().primaryKey().defaultRandom(),
  userId: uuid().notNull().references(() => users.id, { onDelete: 'cascade' }),
  purpose: tokenPurposeEnum().notNull(),
  tokenHash: text().notNull(),
  expiresAt: timestamp({ withTimezone: true }).notNull(),
  usedAt: timestamp({ withTimezone: true }),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
}, t => [
  uniqueIndex('auth_tokens_token_hash_idx').on(t.tokenHash),
  index('auth_tokens_user_id_idx').on(t.userId)
])

// Personal API tokens: one workspace, a role no higher than the owner's there, an expiry. Only the
// SHA-256 of the secret is stored; `prefix` (the first characters) lets the owner recognise it.
export const apiTokens = pgTable('api_tokens', {
  id: uuid().primaryKey().defaultRandom(),
  userId: uuid().notNull().references(() => users.id, { onDelete: 'cascade' }),
  workspaceId: uuid().notNull().references(() => workspaces.id, { onDelete: 'cascade' }),
  name: text().notNull(),
  role: roleEnum().notNull(),
  tokenHash: text().notNull(),
  prefix: text().notNull(),
  expiresAt: timestamp({ withTimezone: true }).notNull(),
  lastUsedAt: timestamp({ withTimezone: true }),
  revokedAt: timestamp({ withTimezone: true }),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
}, t => [
  uniqueIndex('api_tokens_token_hash_idx').on(t.tokenHash),
  index('api_tokens_user_id_idx').on(t.userId),
  index('api_tokens_workspace_id_idx').on(t.workspaceId)
])

// Filled by the local fake SMTP server (scripts/mail-fake.ts) only.
export const mailOutbox = pgTable('mail_outbox', {
  id: uuid().primaryKey().defaultRandom(),
  mailFrom: text().notNull(),
  mailTo: text().array().notNull(),
  subject: text().notNull(),
  textBody: text().notNull(),
  htmlBody: text(),
  raw: text().notNull(),
  receivedAt: timestamp({ withTimezone: true }).notNull().defaultNow()
}, t => [index('mail_outbox_received_at_idx').on(t.receivedAt)])

export const auditEvents = pgTable('audit_events', {
  id: uuid().primaryKey().defaultRandom(),
  workspaceId: uuid().references(() => workspaces.id, { onDelete: 'cascade' }),
  actorId: uuid().references(() => users.id, { onDelete: 'set null' }),
  action: text().notNull(),
  subjectType: text().notNull(),
  subjectId: text(),
  detail: jsonb().$type<Record<string, unknown>>().notNull().default(sql`'{}'::jsonb`),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
}, t => [
  index('audit_events_workspace_id_idx').on(t.workspaceId),
  index('audit_events_actor_id_idx').on(t.actorId)
])

export const usersRelations = relations(users, ({ many }) => ({
  memberships: many(memberships),
  sessions: many(sessions)
}))

export const sessionsRelations = relations(sessions, ({ one }) => ({
  user: one(users, { fields: [sessions.userId], references: [users.id] })
}))

export const workspacesRelations = relations(workspaces, ({ many }) => ({
  memberships: many(memberships),
  invitations: many(invitations)
}))

export const membershipsRelations = relations(memberships, ({ one }) => ({
  workspace: one(workspaces, { fields: [memberships.workspaceId], references: [workspaces.id] }),
  user: one(users, { fields: [memberships.userId], references: [users.id] })
}))

export const invitationsRelations = relations(invitations, ({ one }) => ({
  workspace: one(workspaces, { fields: [invitations.workspaceId], references: [workspaces.id] })
}))

export const authTokensRelations = relations(authTokens, ({ one }) => ({
  user: one(users, { fields: [authTokens.userId], references: [users.id] })
}))

export const apiTokensRelations = relations(apiTokens, ({ one }) => ({
  user: one(users, { fields: [apiTokens.userId], references: [users.id] }),
  workspace: one(workspaces, { fields: [apiTokens.workspaceId], references: [workspaces.id] })
}))

export const auditEventsRelations = relations(auditEvents, ({ one }) => ({
  workspace: one(workspaces, { fields: [auditEvents.workspaceId], references: [workspaces.id] })
}))

export type User = typeof users.$inferSelect
export type NewUser = typeof users.$inferInsert
export type Workspace = typeof workspaces.$inferSelect
export type Membership = typeof memberships.$inferSelect
export type Invitation = typeof invitations.$inferSelect
export type AuthToken = typeof authTokens.$inferSelect
export type ApiToken = typeof apiTokens.$inferSelect
export type MailMessage = typeof mailOutbox.$inferSelect
export type AuditEvent = typeof auditEvents.$inferSelect
export type NewAuditEvent = typeof auditEvents.$inferInsert
