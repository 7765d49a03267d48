export interface ClubDetails {
  id: number
  slug: string
  name: string
  town: string
  about: string
  primaryColor: string
  secondaryColor: string
  logoUrl: string | null
  roles: string[]
  memberCount: number
}

export interface PublicClub {
  slug: string
  name: string
  town: string
  about: string
  primaryColor: string
  secondaryColor: string
  logoUrl: string | null
}

/** The club of the current /clubs/[slug] route, from the account store (loaded by club-role). */
export function useCurrentClub() {
  const route = useRoute()
  const account = useAccountStore()
  return computed(() => {
    const slug = route.params.slug
    return typeof slug === 'string' ? account.clubBySlug(slug) : undefined
  })
}

/**
 * The club of a page guarded by club-role. It keeps the last known club while the page
 * navigates away after the store changed under it (a new slug, leaving the club).
 */
export function useRequiredClub() {
  const club = useCurrentClub()
  let last = club.value
  if (!last) throw createError({ status: 404, statusText: 'Not Found', message: 'Club not found', fatal: true })
  return computed(() => {
    if (club.value) last = club.value
    return last!
  })
}

export function useClubDetails(clubId: MaybeRefOrGetter<number>) {
  return useFetch<ClubDetails>(() => `/api/clubs/${toValue(clubId)}`, {
    key: () => `club-${toValue(clubId)}`,
  })
}

export interface ClubMember {
  userId: number
  name: string
  email: string
  roles: string[]
  joinedAt: string
}

/** PATCH members/:userId answers at least the id and the new roles. */
export type MemberRolesResponse = Pick<ClubMember, 'userId' | 'roles'> & Partial<ClubMember>

export interface ClubInvitation {
  id: number
  email: string
  roles: string[]
  createdAt: string
  expiresAt: string
  status: 'pending' | 'expired'
}

export interface ClubMembersResponse {
  members: ClubMember[]
  invitations: ClubInvitation[]
}

export function useClubMembers(clubId: MaybeRefOrGetter<number>) {
  return useFetch<ClubMembersResponse>(() => `/api/clubs/${toValue(clubId)}/members`, {
    key: () => `club-members-${toValue(clubId)}`,
  })
}

export function roleLabel(role: string): string {
  return isRole(role) ? ROLE_LABELS[role] : role
}
