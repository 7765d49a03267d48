import { z } from 'zod'
import { tokenSchema } from '#shared/schemas/auth'

const params = z.object({ token: tokenSchema })

export default defineEventHandler(async (event) => {
  const { token } = validParams(event, params)
  const found = await findOpenInvitation(token)
  if (!found) throw invitationGone()
  const existing = await findUserByEmail(found.invitation.email)
  return {
    club: { name: found.club.name, slug: found.club.slug },
    email: found.invitation.email,
    roles: found.invitation.roles,
    existingAccount: existing !== null,
  }
})
