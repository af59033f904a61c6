// The registry of the public API: one entry per route file under server/api, with the zod schemas
// the route itself validates with (by name, from shared/utils). The OpenAPI description
// (document.ts) is generated from it, the API-reference page renders that description, and
// tests/unit/server/openapi-routes.test.ts fails when a route file and this list disagree (a file
// missing here, an entry with no file, or a schema name other than the one the route reads).
import * as accountSchemas from '../../../shared/utils/account-schemas'
import * as tokenSchemas from '../../../shared/utils/token-schemas'
import * as workflowSchemas from '../../../shared/utils/workflow-schemas'
import * as tableSchemas from '../../../shared/utils/set-table-schemas'
import * as impactSchemas from '../../../shared/utils/impact-schemas'
import * as jobSchemas from '../../../shared/utils/job-schemas'
import * as resultSchemas from '../../../shared/utils/result-schemas'
import * as studyExportSchemas from '../../../shared/utils/study-export-schema'
import type { Role } from '../../../shared/utils/roles'

/** Every zod schema a route may name, by its exported name. */
export const API_SCHEMAS = { ...accountSchemas, ...tokenSchemas, ...workflowSchemas, ...tableSchemas, ...impactSchemas, ...studyExportSchemas, ...jobSchemas, ...resultSchemas }
export type SchemaName = {
  [K in keyof typeof API_SCHEMAS]: (typeof API_SCHEMAS)[K] extends { safeParse: unknown } ? K : never
}[keyof typeof API_SCHEMAS]

/**
 * Who may call: `public` anyone; `session` a signed-in browser session only (account routes: an
 * API token gets 403); `workspace` a session or an API token of that workspace, with `minRole`;
 * `token` only an API token; `outbox` the mail fake's operator key or a signed-in user.
 */
export type Access = 'public' | 'session' | 'workspace' | 'token' | 'outbox'

export interface MultipartField { name: string, type: 'file' | 'text', required?: boolean, description: string }

export interface ApiRoute {
  method: 'get' | 'post' | 'patch' | 'delete'
  /** OpenAPI path template, e.g. /api/workspaces/{wid}/sets/{sid}. */
  path: string
  summary: string
  tag: string
  access: Access
  minRole?: Role
  /** JSON body: the schema the route passes to readValid. */
  body?: SchemaName
  /** Query string: the schema the route passes to queryValid. */
  query?: SchemaName
  /** multipart/form-data fields (uploads). */
  multipart?: MultipartField[]
  /** Media types of a successful answer other than JSON (downloads). */
  produces?: string[]
  /** Success status when not 200. */
  status?: 201 | 202
}

const ws = '/api/workspaces/{wid}'
const W = (minRole: Role) => ({ access: 'workspace' as const, minRole })

export const API_ROUTES: ApiRoute[] = [
  // Accounts (browser session only)
  { method: 'post', path: '/api/auth/register', summary: 'Create an account; a verification mail follows', tag: 'account', access: 'public', body: 'registerSchema', status: 201 },
  { method: 'post', path: '/api/auth/verify', summary: 'Verify an e-mail address with the mailed token', tag: 'account', access: 'public', body: 'tokenSchema' },
  { method: 'post', path: '/api/auth/verify-resend', summary: 'Send the verification mail again', tag: 'account', access: 'public', body: 'resetRequestSchema' },
  { method: 'post', path: '/api/auth/signin', summary: 'Sign in; sets the session cookie (throttled)', tag: 'account', access: 'public', body: 'signinSchema' },
  { method: 'post', path: '/api/auth/signout', summary: 'Sign out and end the session', tag: 'account', access: 'public' },
  { method: 'post', path: '/api/auth/reset-request', summary: 'Mail a password-reset link', tag: 'account', access: 'public', body: 'resetRequestSchema' },
  { method: 'post', path: '/api/auth/reset', summary: 'Set a new password with a reset token', tag: 'account', access: 'public', body: 'resetSchema' },
  { method: 'get', path: '/api/auth/me', summary: 'The signed-in user and their workspaces', tag: 'account', access: 'session' },
  { method: 'patch', path: '/api/auth/me', summary: 'Change the display name', tag: 'account', access: 'session', body: 'profileSchema' },
  { method: 'post', path: '/api/auth/password', summary: 'Change the password; other sessions end', tag: 'account', access: 'session', body: 'passwordChangeSchema' },
  { method: 'get', path: '/api/auth/tokens', summary: 'List your API tokens (never their secrets)', tag: 'tokens', access: 'session' },
  { method: 'post', path: '/api/auth/tokens', summary: 'Create an API token for one workspace; the secret is in this answer only', tag: 'tokens', access: 'session', body: 'apiTokenCreateSchema', status: 201 },
  { method: 'delete', path: '/api/auth/tokens/{tid}', summary: 'Revoke one of your API tokens', tag: 'tokens', access: 'session' },
  { method: 'get', path: '/api/auth/token', summary: 'The workspace and role of the API token sent with this request', tag: 'tokens', access: 'token' },
  { method: 'get', path: '/api/invitations/{token}', summary: 'What an invitation link offers', tag: 'members', access: 'public' },
  { method: 'post', path: '/api/invitations/{token}', summary: 'Accept an invitation', tag: 'members', access: 'session' },
  { method: 'get', path: '/api/health', summary: 'Health check: 200 when PostgreSQL and Redis answer', tag: 'service', access: 'public' },
  { method: 'get', path: '/api/outbox', summary: 'Mail caught by the local mail fake (only while it is in use)', tag: 'service', access: 'outbox' },
  { method: 'get', path: '/api/openapi.json', summary: 'This description (OpenAPI 3.1)', tag: 'service', access: 'public' },
  { method: 'get', path: '/api/samples/{folder}/{file}', summary: 'Download one of the sample files (sets, bins, measurements) for a first run', tag: 'service', access: 'session', produces: ['text/csv', 'application/json', 'application/octet-stream'] },

  // Workspaces and members
  { method: 'get', path: '/api/workspaces', summary: 'Your workspaces', tag: 'workspaces', access: 'session' },
  { method: 'post', path: '/api/workspaces', summary: 'Create a workspace; you become its owner', tag: 'workspaces', access: 'session', body: 'workspaceCreateSchema', status: 201 },
  { method: 'get', path: ws, summary: 'One workspace and your role in it', tag: 'workspaces', ...W('viewer') },
  { method: 'get', path: `${ws}/members`, summary: 'Members; pending invitations for owners', tag: 'members', ...W('viewer') },
  { method: 'post', path: `${ws}/members`, summary: 'Invite a colleague by e-mail with a role', tag: 'members', ...W('owner'), body: 'inviteSchema', status: 201 },
  { method: 'patch', path: `${ws}/members/{uid}`, summary: 'Change a member\'s role', tag: 'members', ...W('owner'), body: 'rolePatchSchema' },
  { method: 'delete', path: `${ws}/members/{uid}`, summary: 'Remove a member (owners) or leave (yourself, browser session only)', tag: 'members', ...W('owner') },
  { method: 'delete', path: `${ws}/invitations/{iid}`, summary: 'Revoke a pending invitation', tag: 'members', ...W('owner') },
  { method: 'get', path: `${ws}/jobs`, summary: 'Queued, running and finished work of the workspace (filters: kind, state, who, when)', tag: 'workspaces', ...W('viewer'), query: 'jobsQuerySchema' },

  // Error sets
  { method: 'get', path: `${ws}/sets`, summary: 'The error-set library and the builds in progress', tag: 'sets', ...W('viewer') },
  {
    method: 'post', path: `${ws}/sets`, summary: 'Upload a .sheafset file', tag: 'sets', ...W('analyst'), status: 201,
    multipart: [
      { name: 'file', type: 'file', required: true, description: 'The .sheafset file' },
      { name: 'name', type: 'text', description: 'Name in the library (default: the file header\'s)' }
    ]
  },
  {
    method: 'post', path: `${ws}/sets/import`, summary: 'Import a set from a CSV, TSV (gzipped or not) or Parquet table', tag: 'sets', ...W('analyst'), status: 201,
    multipart: [
      { name: 'header', type: 'text', description: 'The set header as JSON (setTableHeaderSchema); or send it as the file field `sidecar`' },
      { name: 'sidecar', type: 'file', description: 'A JSON sidecar file with the set header (instead of the `header` field)' },
      { name: 'file', type: 'file', required: true, description: 'The table: .csv, .tsv, .csv.gz, .tsv.gz or .parquet, long or wide layout' }
    ]
  },
  { method: 'get', path: `${ws}/sets/{sid}`, summary: 'One error set: metadata and header', tag: 'sets', ...W('viewer') },
  { method: 'patch', path: `${ws}/sets/{sid}`, summary: 'Rename an error set', tag: 'sets', ...W('analyst'), body: 'setRenameSchema' },
  { method: 'delete', path: `${ws}/sets/{sid}`, summary: 'Delete an error set no result uses', tag: 'sets', ...W('owner') },
  { method: 'get', path: `${ws}/sets/{sid}/file`, summary: 'Download the .sheafset file as stored', tag: 'sets', ...W('viewer'), produces: ['application/octet-stream'] },
  {
    method: 'get', path: `${ws}/sets/{sid}/table`, summary: 'Export the members as a CSV, TSV or Parquet table (long or wide)', tag: 'sets', ...W('viewer'),
    query: 'setTableExportQuerySchema', produces: ['text/csv', 'text/tab-separated-values', 'application/gzip', 'application/vnd.apache.parquet', 'application/json']
  },
  { method: 'get', path: `${ws}/sets/{sid}/densities`, summary: 'x·f(x, Q²) of chosen flavours with the set\'s band', tag: 'sets', ...W('viewer'), query: 'densitiesQuerySchema' },
  { method: 'get', path: `${ws}/sets/{sid}/sum-rules`, summary: 'Momentum and valence sum rules of every member', tag: 'sets', ...W('viewer'), query: 'sumRulesQuerySchema' },
  { method: 'post', path: `${ws}/sets/builds`, summary: 'Build an error set from a parametrised fit (queued); a nuclear modification for a list of nuclei builds one set per nucleus in the same job', tag: 'sets', ...W('analyst'), body: 'setBuildSchema', status: 201 },
  { method: 'get', path: `${ws}/sets/builds/{bid}`, summary: 'A set build\'s state and progress', tag: 'sets', ...W('viewer') },
  { method: 'post', path: `${ws}/sets/builds/{bid}/cancel`, summary: 'Cancel a queued or running set build', tag: 'sets', ...W('analyst') },
  { method: 'post', path: `${ws}/sets/builds/{bid}/rerun`, summary: 'Run a failed or cancelled set build again (queued)', tag: 'sets', ...W('analyst'), status: 202 },
  { method: 'post', path: `${ws}/sets/examples`, summary: 'Add the example TOY sets to the library (once; 201)', tag: 'sets', ...W('analyst'), status: 201 },
  { method: 'get', path: `${ws}/sets/{sid}/update`, summary: 'The set update (reweighting or profiling) that saved this set, or null', tag: 'updates', ...W('viewer') },

  // Studies
  { method: 'get', path: `${ws}/studies`, summary: 'Studies with their newest result per set', tag: 'studies', ...W('viewer') },
  { method: 'post', path: `${ws}/studies`, summary: 'Create a study', tag: 'studies', ...W('analyst'), body: 'studyCreateSchema', status: 201 },
  { method: 'post', path: `${ws}/studies/validate`, summary: 'Check a draft study without saving it', tag: 'studies', ...W('viewer'), body: 'studyDraftSchema' },
  { method: 'get', path: `${ws}/studies/{id}`, summary: 'One study with its result versions, measurements and the sets they name', tag: 'studies', ...W('viewer') },
  { method: 'patch', path: `${ws}/studies/{id}`, summary: 'Save edits to a study', tag: 'studies', ...W('analyst'), body: 'studyPatchSchema' },
  { method: 'delete', path: `${ws}/studies/{id}`, summary: 'Delete a study and its results', tag: 'studies', ...W('owner') },
  { method: 'post', path: `${ws}/studies/{id}/run`, summary: 'Run a study on its sets: one queued result per set', tag: 'studies', ...W('analyst'), body: 'runRequestSchema', status: 202 },
  { method: 'get', path: `${ws}/studies/{id}/comparison`, summary: 'Compare the newest results of several sets', tag: 'studies', ...W('viewer'), query: 'comparisonQuerySchema' },
  { method: 'get', path: `${ws}/studies/{id}/export`, summary: 'All of a study\'s sets side by side: CSV, JSON or LaTeX', tag: 'studies', ...W('viewer'), query: 'studyExportQuerySchema', produces: ['text/csv', 'application/json', 'application/x-latex'] },
  { method: 'get', path: `${ws}/studies/{id}/sensitivity`, summary: 'Correlation (cos φ) and sensitivity of each bin to a density', tag: 'updates', ...W('viewer'), query: 'sensitivityQuerySchema' },
  { method: 'get', path: `${ws}/studies/{id}/updates`, summary: 'The study\'s set updates by a measurement, newest first', tag: 'updates', ...W('viewer') },
  { method: 'post', path: `${ws}/studies/{id}/updates`, summary: 'Update a set by a measurement: reweighting (replicas) or profiling (Hessian), queued', tag: 'updates', ...W('analyst'), body: 'impactUpdateSchema', status: 202 },
  { method: 'get', path: `${ws}/studies/{id}/updates/{uid}`, summary: 'One set update with its progress and summary', tag: 'updates', ...W('viewer') },
  { method: 'post', path: `${ws}/studies/{id}/updates/{uid}/cancel`, summary: 'Cancel a queued or running set update', tag: 'updates', ...W('analyst') },
  { method: 'get', path: `${ws}/studies/{id}/measurements`, summary: 'The measurements of a study', tag: 'measurements', ...W('viewer') },
  {
    method: 'post', path: `${ws}/studies/{id}/measurements`, summary: 'Upload a measurement (JSON body measurementJsonSchema, or multipart)', tag: 'measurements', ...W('analyst'), body: 'measurementJsonSchema', status: 201,
    multipart: [
      { name: 'name', type: 'text', required: true, description: 'Name of the measurement' },
      { name: 'points', type: 'file', required: true, description: 'CSV of the measured points' },
      { name: 'correlation', type: 'file', description: 'CSV correlation matrix' },
      { name: 'correlationOf', type: 'text', description: 'What the correlation matrix covers' }
    ]
  },
  { method: 'get', path: `${ws}/studies/{id}/measurements/{mid}`, summary: 'One measurement', tag: 'measurements', ...W('viewer') },
  { method: 'delete', path: `${ws}/studies/{id}/measurements/{mid}`, summary: 'Delete a measurement', tag: 'measurements', ...W('analyst') },
  { method: 'get', path: `${ws}/studies/{id}/measurements/{mid}/chi2`, summary: 'χ² of the measurement against the newest results', tag: 'measurements', ...W('viewer'), query: 'chi2QuerySchema' },

  // Results
  { method: 'get', path: `${ws}/results/{rid}`, summary: 'One result: state, progress and, once finished, its bands (bins paged past 2000: binsOffset, binsLimit)', tag: 'results', ...W('viewer'), query: 'resultQuerySchema' },
  { method: 'delete', path: `${ws}/results/{rid}`, summary: 'Delete a result version', tag: 'results', ...W('analyst') },
  { method: 'get', path: `${ws}/results/{rid}/progress`, summary: 'State and progress only (cheap to poll)', tag: 'results', ...W('viewer') },
  { method: 'get', path: `${ws}/results/{rid}/events`, summary: 'Server-sent progress events', tag: 'results', ...W('viewer'), produces: ['text/event-stream'] },
  { method: 'post', path: `${ws}/results/{rid}/cancel`, summary: 'Cancel a queued or running result', tag: 'results', ...W('analyst') },
  { method: 'get', path: `${ws}/results/{rid}/export`, summary: 'Export a finished result: CSV, JSON, LaTeX, covariance or correlation', tag: 'results', ...W('viewer'), query: 'exportQuerySchema', produces: ['text/csv', 'application/json', 'application/x-latex'] },
  { method: 'get', path: `${ws}/results/{rid}/matrices`, summary: 'Bin-to-bin covariance and correlation', tag: 'results', ...W('viewer'), query: 'bandsQuerySchema' },
  { method: 'get', path: `${ws}/results/{rid}/contributions`, summary: 'Per-eigenvector contributions to one bin', tag: 'results', ...W('viewer'), query: 'contributionsQuerySchema' },
  { method: 'post', path: `${ws}/results/{rid}/submit`, summary: 'Review: submit a finished result', tag: 'review', ...W('analyst'), body: 'reviewCommentSchema' },
  { method: 'post', path: `${ws}/results/{rid}/approve`, summary: 'Review: approve a submitted result', tag: 'review', ...W('owner'), body: 'reviewCommentSchema' },
  { method: 'post', path: `${ws}/results/{rid}/return`, summary: 'Review: return a submitted result', tag: 'review', ...W('owner'), body: 'returnCommentSchema' }
]
