import { z } from 'zod'

// Request bodies shared by the forms and the server routes, so both report the same field errors.

export const emailSchema = z.string().trim().toLowerCase()
  .pipe(z.email({ error: 'Enter a valid e-mail address' }).max(254, 'E-mail address is too long'))

/** At least 10 characters with letters and at least one digit or symbol. */
export const passwordSchema = z.string()
  .min(10, 'Use at least 10 characters')
  .max(200, 'Use at most 200 characters')
  .refine(p => /\p{L}/u.test(p), 'Include at least one letter')
  .refine(p => /[^\p{L}\s]/u.test(p), 'Include at least one digit or symbol')

export const nameSchema = z.string().trim().min(1, 'Enter your name').max(120, 'Use at most 120 characters')

export const registerSchema = z.object({ email: emailSchema, name: nameSchema, password: passwordSchema })
  .refine(b => !b.password.toLowerCase().includes(b.email.split('@')[0]!), {
    path: ['password'], message: 'The password must not contain your e-mail name'
  })

export const signinSchema = z.object({ email: emailSchema, password: z.string().min(1, 'Enter your password').max(200) })
export const tokenSchema = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{20,100}$/, 'This link is malformed') })
export const resetRequestSchema = z.object({ email: emailSchema })
export const resetSchema = z.object({ token: tokenSchema.shape.token, password: passwordSchema })
export const profileSchema = z.object({ name: nameSchema })
export const passwordChangeSchema = z.object({ currentPassword: z.string().min(1, 'Enter your current password').max(200), newPassword: passwordSchema })

export const workspaceNameSchema = z.string().trim().min(2, 'Use at least 2 characters').max(120, 'Use at most 120 characters')
export const workspaceCreateSchema = z.object({ name: workspaceNameSchema })
export const roleSchema = z.enum(['viewer', 'analyst', 'owner'], { error: 'Choose viewer, analyst or owner' })
export const inviteSchema = z.object({ email: emailSchema, role: roleSchema })
export const rolePatchSchema = z.object({ role: roleSchema })

/** Zod issues as { field: first message }, the shape the forms show beside each input. */
export function fieldErrors(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {}
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_'
    out[key] ??= issue.message
  }
  return out
}
