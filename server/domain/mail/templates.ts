// Every mail Sheaf sends, composed in one place: plain text and HTML with the same lines and one
// link (absolute, from APP_ORIGIN). Accounts: verification, reset, invitation. Workflow: a
// queued job has ended, a review step happened.

export interface MailContent { subject: string, text: string, html: string }

const escape = (s: string) => s.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' }[c]!))

function compose(subject: string, greeting: string, lines: string[], link: string, action: string): MailContent {
  const text = [greeting, '', ...lines, '', `${action}: ${link}`, '', '— Sheaf'].join('\n')
  const html = `<p>${escape(greeting)}</p>${lines.map(l => `<p>${escape(l)}</p>`).join('')}`
    + `<p><a href="${escape(link)}">${escape(action)}</a></p><p>— Sheaf</p>`
  return { subject, text, html }
}

export const verifyEmailMail = (name: string, link: string) => compose(
  'Confirm your e-mail address for Sheaf', `Hello ${name},`,
  ['Please confirm this address to finish creating your Sheaf account. The link is valid for 48 hours.'],
  link, 'Confirm my e-mail address')

export const resetPasswordMail = (name: string, link: string) => compose(
  'Choose a new Sheaf password', `Hello ${name},`,
  ['Someone asked to reset the password of this Sheaf account. If it was you, use the link within one hour; otherwise ignore this message.'],
  link, 'Choose a new password')

export const invitationMail = (inviter: string, workspace: string, role: string, link: string) => compose(
  `${inviter} invited you to ${workspace} on Sheaf`, 'Hello,',
  [`${inviter} invited you to join the workspace "${workspace}" as ${role}. The invitation is valid for 7 days.`],
  link, 'Open the invitation')

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
  return compose(`Sheaf: study ${f.studyName} on ${f.setName} ${subjectState}`, 'Hello,', [`The computation of ${what} ${outcome}`], f.link, 'Open the study')
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
  return compose(`Sheaf: error set ${f.name} ${subjectState}`, 'Hello,', [`The error set "${f.name}" ${outcome}`], f.link, f.state === 'done' ? 'Open the set' : 'Open the library')
}

export interface ReviewFacts {
  action: 'submitted' | 'approved' | 'returned'
  actorName: string
  studyName: string
  setName: string
  /** The set's own version ("1.2"), beside its name. */
  setVersion?: string
  /** The result's version number in the study. */
  version: number
  comment: string
  link: string
}

/**
 * The mail sent on each review step (to the owners on submit, to the submitter on a decision):
 * subject and text name the study, the set with its version, and the result version.
 */
export function reviewStepMail(f: ReviewFacts): MailContent {
  const set = `set ${f.setName}${f.setVersion ? ` ${f.setVersion}` : ''}`
  const what = `study "${f.studyName}" on ${set}, result version ${f.version}`
  const line = {
    submitted: `${f.actorName} submitted ${what} for sign-off.`,
    approved: `${f.actorName} approved ${what}. This version is now frozen.`,
    returned: `${f.actorName} returned ${what} for changes.`
  }[f.action]
  const lines = f.comment ? [line, `Comment: ${f.comment}`] : [line]
  return compose(`Sheaf: ${f.studyName} on ${set}, result v${f.version} ${f.action}`, 'Hello,', lines, f.link, 'Open the result')
}
