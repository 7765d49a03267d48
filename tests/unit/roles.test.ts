import { describe, expect, it } from 'vitest'
import { clubNavigation, hasAnyRole, normaliseRoles, ROLES } from '../../shared/utils/roles'

describe('roles', () => {
  it('admits a member holding any one of the wanted roles', () => {
    expect(hasAnyRole(['editor', 'streamer'], ['streamer'])).toBe(true)
    expect(hasAnyRole(['editor'], ['admin', 'organizer'])).toBe(false)
    expect(hasAnyRole([], ['admin'])).toBe(false)
  })

  it('puts roles in canonical order without duplicates', () => {
    expect(normaliseRoles(['editor', 'admin', 'editor'])).toEqual(['admin', 'editor'])
  })

  it('shows each role only its own areas', () => {
    const labels = (roles: string[]) => clubNavigation('saltmarsh-sword-guild', roles).map(i => i.label)
    expect(labels(['scorekeeper'])).toEqual(['Overview', 'Ring desk'])
    expect(labels(['streamer'])).toEqual(['Overview', 'Cue desk'])
    expect(labels(['admin'])).toEqual(['Overview', 'Breakdowns', 'Readers', 'Club profile', 'Members'])
    expect(labels(['organizer', 'editor'])).toEqual(['Overview', 'Events', 'Rule sets', 'Ring desk', 'Cue desk', 'Footage', 'Breakdowns', 'Cards', 'Readers'])
  })

  it('gives a member with every role every area once', () => {
    const items = clubNavigation('x', [...ROLES])
    expect(new Set(items.map(i => i.to)).size).toBe(items.length)
    expect(items).toHaveLength(11)
  })

  it('gives a non-member no navigation at all', () => {
    expect(clubNavigation('x', [])).toEqual([])
  })
})
