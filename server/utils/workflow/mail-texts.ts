// Texts of the workflow's e-mails: a queued job has ended, a review step happened.
// No Nitro imports: the worker composes the job-end mails with these.
import type { MailContent } from '../../mail/templates'

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' }[c]!))

function workflowMail(subject: string, lines: string[], link: string, action: string): MailContent {
  const text = ['Hello,', '', ...lines, '', `${action}: ${link}`, '', '— Sheaf'].join('\n')
  const html = `<p>Hello,</p>${lines.map(l => `<p>${escapeHtml(l)}</p>`).join('')}`
    + `<p><a href="${escapeHtml(link)}">${escapeHtml(action)}</a></p><p>— Sheaf</p>`
  return { subject, text, html }
}

/** Path of a study's page in the app, where its results are shown. */
export const studyPagePath = (studyId: string, resultId?: string) =>
  `/studies/${studyId}${resultId ? `?result=${resultId}` : ''}`
/** Path of an error set's page in the app. */
export const setPagePath = (setId: string) => `/sets/${setId}`

const seconds = (ms: number) => `${(ms / 1000).toFixed(1)} s`

export interface RunEndFacts {
  studyName: string
  setName: string
  version: number
  state: 'done' | 'failed' | 'cancelled'
  error?: string | null
  durationMs: number
  link: string
}

/** The mail to whoever pressed Run when the job ends (done, failed or cancelled). */
export function runEndedMail(f: RunEndFacts): MailContent {
  const what = `"${f.studyName}" on ${f.setName}, version ${f.version}`
  const outcome = {
    done: `finished after ${seconds(f.durationMs)}. The bands are ready.`,
    failed: `failed after ${seconds(f.durationMs)}: ${f.error ?? 'no reason was recorded'}`,
    cancelled: `was cancelled after ${seconds(f.durationMs)}.`
  }[f.state]
  const subjectState = { done: 'finished', failed: 'failed', cancelled: 'cancelled' }[f.state]
  return workflowMail(`Sheaf: study ${f.studyName} on ${f.setName} ${subjectState}`, [`The computation of ${what} ${outcome}`], f.link, 'Open the study')
}

export interface BuildEndFacts {
  name: string
  state: 'done' | 'failed' | 'cancelled'
  error?: string | null
  durationMs: number
  memberCount?: number
  link: string
}

/** The mail to whoever asked for a set to be built from a fit, when the build ends. */
export function buildEndedMail(f: BuildEndFacts): MailContent {
  const outcome = {
    done: `is built (${f.memberCount ?? '?'} members, ${seconds(f.durationMs)}) and is now in the library.`,
    failed: `could not be built after ${seconds(f.durationMs)}: ${f.error ?? 'no reason was recorded'}`,
    cancelled: `was cancelled after ${seconds(f.durationMs)}.`
  }[f.state]
  const subjectState = { done: 'built', failed: 'failed', cancelled: 'cancelled' }[f.state]
  return workflowMail(`Sheaf: error set ${f.name} ${subjectState}`, [`The error set "${f.name}" ${outcome}`], f.link, f.state === 'done' ? 'Open the set' : 'Open the library')
}

export interface ReviewFacts {
  action: 'submitted' | 'approved' | 'returned'
  actorName: string
  studyName: string
  setName: string
  version: number
  comment: string
  link: string
}

/** The mail sent on each review step (to the owners on submit, to the submitter on a decision). */
export function reviewStepMail(f: ReviewFacts): MailContent {
  const what = `"${f.studyName}" on ${f.setName}, version ${f.version}`
  const line = {
    submitted: `${f.actorName} submitted ${what} for sign-off.`,
    approved: `${f.actorName} approved ${what}. This version is now frozen.`,
    returned: `${f.actorName} returned ${what} for changes.`
  }[f.action]
  const lines = f.comment ? [line, `Comment: ${f.comment}`] : [line]
  return workflowMail(`Sheaf: result ${f.studyName} v${f.version} ${f.action}`, lines, f.link, 'Open the result')
}
