import { and, eq, gt, isNull, sql } from 'drizzle-orm'
import type { Role } from '#shared/utils/roles'

/** An invitation that can still be accepted, with its club; null when unknown, used, revoked or expired. */
export async function findOpenInvitation(token: string) {
  const t = schema.invitations
  const [row] = await useDb().select({ invitation: t, club: schema.clubs })
    .from(t).innerJoin(schema.clubs, eq(schema.clubs.id, t.clubId))
    .where(and(eq(t.tokenHash, hashToken(token)), isNull(t.acceptedAt), isNull(t.revokedAt), gt(t.expiresAt, new Date())))
  return row ?? null
}

export function invitationGone() {
  return createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This invitation has expired, was already used or was withdrawn. Ask the club admin for a new one.' })
}

export async function findUserByEmail(email: string) {
  const [user] = await useDb().select().from(schema.users).where(sql`lower(${schema.users.email}) = ${email.toLowerCase()}`)
  return user ?? null
}

export async function sendInvitationMail(to: string, clubName: string, roles: readonly Role[], token: string) {
  const labels = roles.map(role => ROLE_LABELS[role]).join(', ')
  await sendMail({
    to,
    subject: `You are invited to ${clubName} on Unscathed`,
    text: [
      `${clubName} invites you to join its team on Unscathed as: ${labels}.`,
      '',
      'To accept, open this link and choose a password:',
      appLink(`/invite/${token}`),
      '',
      `The link works once and expires in ${Math.round(INVITATION_TTL_MS / 86400000)} days.`,
    ].join('\n'),
  })
}

export function invitationView(row: typeof schema.invitations.$inferSelect) {
  return {
    id: row.id,
    email: row.email,
    roles: row.roles,
    createdAt: row.createdAt,
    expiresAt: row.expiresAt,
    status: row.expiresAt > new Date() ? 'pending' as const : 'expired' as const,
  }
}
