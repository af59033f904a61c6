import { z } from 'zod'
import { storableString } from './storable'

// Request bodies shared by the forms and the server routes, so both report the same field errors.
// Every string is a storableString: a NUL or a lone surrogate is a field error, not a 500.

export const emailSchema = storableString().trim().toLowerCase()
  .pipe(z.email({ error: 'Enter a valid e-mail address' }).max(254, 'E-mail address is too long'))

/** At least 10 characters with letters and at least one digit or symbol. */
export const passwordSchema = storableString()
  .min(10, 'Use at least 10 characters')
  .max(200, 'Use at most 200 characters')
  .refine(p => /\p{L}/u.test(p), 'Include at least one letter')
  .refine(p => /[^\p{L}\s]/u.test(p), 'Include at least one digit or symbol')

export const nameSchema = storableString().trim().min(1, 'Enter your name').max(120, 'Use at most 120 characters')

export const registerSchema = z.object({ email: emailSchema, name: nameSchema, password: passwordSchema })
  .refine(b => !b.password.toLowerCase().includes(b.email.split('@')[0]!), {
    path: ['password'], message: 'The password must not contain your e-mail name'
  })

export const signinSchema = z.object({ email: emailSchema, password: storableString().min(1, 'Enter your password').max(200, 'Use at most 200 characters') })
export const tokenSchema = z.object({ token: storableString().regex(/^[A-Za-z0-9_-]{20,100}$/, 'This link is malformed') })
export const resetRequestSchema = z.object({ email: emailSchema })
export const resetSchema = z.object({ token: tokenSchema.shape.token, password: passwordSchema })
export const profileSchema = z.object({ name: nameSchema })
export const passwordChangeSchema = z.object({ currentPassword: storableString().min(1, 'Enter your current password').max(200, 'Use at most 200 characters'), newPassword: passwordSchema })

export const workspaceNameSchema = storableString().trim().min(2, 'Use at least 2 characters').max(120, 'Use at most 120 characters')
export const workspaceCreateSchema = z.object({ name: workspaceNameSchema })
export const roleSchema = z.enum(['viewer', 'analyst', 'owner'], { error: 'Choose viewer, analyst or owner' })
export const inviteSchema = z.object({ email: emailSchema, role: roleSchema })
export const rolePatchSchema = z.object({ role: roleSchema })

/**
 * Zod issues as { field: first message }, the shape the forms show beside each input. A field
 * the schema does not know is named by itself ("Unknown field colour").
 */
export function fieldErrors(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {}
  for (const issue of error.issues) {
    if (issue.code === 'unrecognized_keys') {
      for (const key of issue.keys) out[[...issue.path, key].join('.')] ??= `Unknown field ${key}`
      continue
    }
    const key = issue.path.length ? issue.path.join('.') : '_'
    out[key] ??= issue.message
  }
  return out
}
