// Plain-text and HTML bodies for the mails Sheaf sends. Links are absolute (APP_ORIGIN).

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
