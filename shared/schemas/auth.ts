import { z } from 'zod'

// Trimmed and lower-cased before the format check, so pasted addresses with spaces still pass.
export const emailSchema = z.string({ error: 'Enter your e-mail address' }).trim().toLowerCase()
  .pipe(z.email({ error: 'Enter a valid e-mail address' }).max(254, { error: 'Use at most 254 characters' }))

export const passwordSchema = z.string({ error: 'Enter a password' })
  .min(10, { error: 'Use at least 10 characters' })
  .max(200, { error: 'Use at most 200 characters' })

export const nameSchema = z.string({ error: 'Enter a name' }).trim().min(1, { error: 'Enter a name' }).max(100)

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string({ error: 'Enter your password' }).min(1, { error: 'Enter your password' }).max(200),
}).strict()

export const resetRequestSchema = z.object({ email: emailSchema }).strict()

export const tokenSchema = z.string().regex(/^[A-Za-z0-9_-]{32,64}$/, { error: 'This link is not valid' })

export const resetConfirmSchema = z.object({
  token: tokenSchema,
  password: passwordSchema,
}).strict()

export const acceptInvitationSchema = z.object({
  name: nameSchema,
  password: passwordSchema,
}).strict()

export const accountUpdateSchema = z.object({ name: nameSchema }).strict()

export const passwordChangeSchema = z.object({
  currentPassword: z.string().min(1, { error: 'Enter your current password' }).max(200),
  newPassword: passwordSchema,
}).strict()

export type SignInInput = z.infer<typeof signInSchema>
