import { z } from 'zod'
import { ROLES } from '../utils/roles'
import { emailSchema } from './auth'

export const hexColorSchema = z.string().regex(/^#[0-9a-fA-F]{6}$/, { error: 'Use a colour like #1d2129' }).transform(s => s.toLowerCase())

export const slugSchema = z.string().trim().toLowerCase()
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, { error: 'Use lower-case letters, digits and single hyphens' })
  .min(3, { error: 'Use at least 3 characters' }).max(48)

export const clubProfileSchema = z.object({
  name: z.string().trim().min(2, { error: 'Enter the club name' }).max(120),
  slug: slugSchema,
  town: z.string().trim().max(120),
  about: z.string().trim().max(2000),
  primaryColor: hexColorSchema,
  secondaryColor: hexColorSchema,
}).strict()

export const rolesSchema = z.array(z.enum(ROLES, { error: 'Unknown role' }))
  .min(1, { error: 'Choose at least one role' })
  .max(ROLES.length)

export const memberRolesSchema = z.object({ roles: rolesSchema }).strict()

export const invitationSchema = z.object({
  email: emailSchema,
  roles: rolesSchema,
}).strict()

export const idParamSchema = z.coerce.number({ error: 'Must be a number' }).int({ error: 'Must be a whole number' }).positive({ error: 'Must be positive' }).max(2147483647)

export type ClubProfileInput = z.infer<typeof clubProfileSchema>
export type InvitationInput = z.infer<typeof invitationSchema>
