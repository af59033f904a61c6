import { and, desc, eq, inArray } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { Result, ReviewState } from '../../database/schema'
import type { Actor } from '../accounts/members'
import { audit } from '../audit'
import { fail } from '../errors'
import { sendNotice } from '../mail/send'
import { reviewStepMail, studyPagePath } from '../mail/templates'
import { appLink, type Settings } from '../settings'

type Action = 'submitted' | 'approved' | 'returned'

// Which review state each step starts from and leads to.
const STEPS: Record<Action, { from: ReviewState[], to: ReviewState }> = {
  submitted: { from: ['draft', 'returned'], to: 'submitted' },
  approved: { from: ['submitted'], to: 'approved' },
  returned: { from: ['submitted'], to: 'returned' }
}

function refusal(r: Result, action: Action) {
  if (r.reviewState === 'approved') return `Version ${r.version} is approved and frozen`
  if (action === 'submitted') return `Version ${r.version} is already submitted for review`
  return `Version ${r.version} is not submitted for review (it is ${r.reviewState})`
}

/**
 * One review step on a finished result: submit (draft/returned → submitted), approve or return
 * (submitted → approved/returned). The state changes only from the expected one (409 otherwise,
 * also when two reviewers race); the step, its comment and an audit event are written in one
 * transaction; then the e-mails go out (owners on submit, the submitter on a decision).
 */
export async function reviewStep(db: DB, settings: Settings, r: Result, workspaceId: string, actor: Actor, action: Action, comment: string) {
  if (r.state !== 'done') fail(409, 'Only a finished result can be reviewed')
  const step = STEPS[action]
  if (!step.from.includes(r.reviewState)) fail(409, refusal(r, action))
  const updated = await db.transaction(async (tx) => {
    const [row] = await tx.update(t.results).set({ reviewState: step.to })
      .where(and(eq(t.results.id, r.id), inArray(t.results.reviewState, step.from))).returning()
    if (!row) fail(409, refusal(r, action))
    await tx.insert(t.resultReviews).values({ resultId: r.id, action, comment, actorId: actor.id })
    await audit(tx, { workspaceId, actorId: actor.id, action: `result.${action}`, subjectType: 'result', subjectId: r.id, detail: { version: r.version, comment } })
    return row
  })
  await mailReviewStep(db, settings, updated, workspaceId, actor, action, comment)
  return updated
}

async function mailReviewStep(db: DB, settings: Settings, r: Result, workspaceId: string, actor: Actor, action: Action, comment: string) {
  let recipients: string[]
  if (action === 'submitted') {
    const owners = await db.select({ email: t.users.email }).from(t.memberships)
      .innerJoin(t.users, eq(t.users.id, t.memberships.userId))
      .where(and(eq(t.memberships.workspaceId, workspaceId), eq(t.memberships.role, 'owner')))
    recipients = owners.map(o => o.email)
  } else {
    const [submit] = await db.select({ email: t.users.email }).from(t.resultReviews)
      .innerJoin(t.users, eq(t.users.id, t.resultReviews.actorId))
      .where(and(eq(t.resultReviews.resultId, r.id), eq(t.resultReviews.action, 'submitted')))
      .orderBy(desc(t.resultReviews.createdAt)).limit(1)
    recipients = submit ? [submit.email] : []
  }
  const snap = r.specSnapshot
  const content = reviewStepMail({
    action, actorName: actor.name, studyName: snap.studyName, setName: snap.set.name, setVersion: snap.set.version, version: r.version, comment,
    link: appLink(settings, studyPagePath(r.studyId, r.id))
  })
  for (const to of new Set(recipients.filter(e => e !== actor.email))) {
    // The step is recorded already; a relay failure must not undo it.
    await sendNotice(settings, to, content)
  }
}
