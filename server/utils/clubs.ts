import type { schema as Schema } from './db'

type Club = typeof Schema.clubs.$inferSelect

export function logoUrl(club: Pick<Club, 'logoKey'>): string | null {
  return club.logoKey ? `/media/${club.logoKey}` : null
}

export function publicClub(club: Club) {
  return {
    slug: club.slug,
    name: club.name,
    town: club.town,
    about: club.about,
    primaryColor: club.primaryColor,
    secondaryColor: club.secondaryColor,
    logoUrl: logoUrl(club),
  }
}

export function privateClub(club: Club, roles: string[], memberCount: number) {
  return { id: club.id, ...publicClub(club), roles, memberCount }
}
