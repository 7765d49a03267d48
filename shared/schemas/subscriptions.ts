import { z } from 'zod'
import { emailSchema, tokenSchema } from './auth'

export const subscribeSchema = z.object({ email: emailSchema }).strict()

export const subscriptionTokenSchema = z.object({ token: tokenSchema }).strict()

// The body of an RFC 8058 one-click POST is exactly `List-Unsubscribe=One-Click`; a browser's
// form on our own page sends the same field.
export const oneClickSchema = z.object({
  'List-Unsubscribe': z.literal('One-Click', { error: 'Send List-Unsubscribe=One-Click' }),
})

export type SubscribeInput = z.infer<typeof subscribeSchema>
