export const ROLES = ['admin', 'organizer', 'scorekeeper', 'streamer', 'commentator', 'editor'] as const
export type Role = typeof ROLES[number]

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  organizer: 'Organizer',
  scorekeeper: 'Scorekeeper',
  streamer: 'Streamer',
  commentator: 'Commentator',
  editor: 'Editor',
}

export const ROLE_DUTIES: Record<Role, string> = {
  admin: 'Club profile, branding, members and their roles.',
  organizer: 'Rule sets, events, entries, pools, rings and finals.',
  scorekeeper: 'Records every bout at a ring desk as the director calls it.',
  streamer: 'Puts boards on air from the cue desk for each ring.',
  commentator: 'Footage, clips, marks and breakdown posts.',
  editor: 'Result cards and publishing on the club site.',
}

export function isRole(value: string): value is Role {
  return (ROLES as readonly string[]).includes(value)
}

/** True when the member holds at least one of the wanted roles. */
export function hasAnyRole(held: readonly string[], wanted: readonly Role[]): boolean {
  return wanted.some(role => held.includes(role))
}

/** Roles in their canonical order, without duplicates. */
export function normaliseRoles(roles: readonly Role[]): Role[] {
  return ROLES.filter(role => roles.includes(role))
}

export interface NavItem {
  label: string
  to: string
  roles: readonly Role[]
}

/** The workspace navigation of one club, filtered by the member's roles. */
export function clubNavigation(slug: string, held: readonly string[]): NavItem[] {
  const base = `/clubs/${slug}`
  const items: NavItem[] = [
    { label: 'Overview', to: base, roles: ROLES },
    { label: 'Events', to: `${base}/events`, roles: ['organizer'] },
    { label: 'Rule sets', to: `${base}/rule-sets`, roles: ['organizer'] },
    { label: 'Ring desk', to: `${base}/desk`, roles: ['scorekeeper', 'organizer'] },
    { label: 'Cue desk', to: `${base}/cue`, roles: ['streamer', 'organizer'] },
    { label: 'Footage', to: `${base}/footage`, roles: ['commentator', 'editor'] },
    { label: 'Breakdowns', to: `${base}/posts`, roles: ['commentator', 'editor', 'admin'] },
    { label: 'Cards', to: `${base}/cards`, roles: ['editor'] },
    { label: 'Readers', to: `${base}/readers`, roles: ['editor', 'admin'] },
    { label: 'Club profile', to: `${base}/profile`, roles: ['admin'] },
    { label: 'Members', to: `${base}/members`, roles: ['admin'] },
  ]
  return items.filter(item => hasAnyRole(held, item.roles))
}
