import { describe, expect, it } from 'vitest'
import { signInSchema, passwordSchema } from '../../shared/schemas/auth'
import { clubProfileSchema, invitationSchema, slugSchema } from '../../shared/schemas/club'

const fieldsOf = (r: { success: boolean, error?: { issues: { path: PropertyKey[] }[] } }) => r.error?.issues.map(i => i.path.join('.')) ?? []

describe('shared schemas', () => {
  it('normalises e-mail addresses to lower case and trims them', () => {
    expect(signInSchema.parse({ email: '  Admin@Saltmarsh.Example ', password: 'x' }).email).toBe('admin@saltmarsh.example')
  })

  it('names the field that is wrong', () => {
    expect(fieldsOf(signInSchema.safeParse({ email: 'not-an-address', password: '' }))).toEqual(['email', 'password'])
  })

  it('refuses unknown fields instead of ignoring them', () => {
    const result = signInSchema.safeParse({ email: 'a@b.example', password: 'x', isAdmin: true })
    expect(result.success).toBe(false)
    expect(result.error?.issues[0]?.code).toBe('unrecognized_keys')
  })

  it('asks for passwords of 10 to 200 characters', () => {
    expect(passwordSchema.safeParse('short').success).toBe(false)
    expect(passwordSchema.safeParse('long enough').success).toBe(true)
    expect(passwordSchema.safeParse('x'.repeat(201)).success).toBe(false)
  })

  it('accepts only URL-safe club addresses', () => {
    expect(slugSchema.parse('Saltmarsh-Sword-Guild')).toBe('saltmarsh-sword-guild')
    for (const bad of ['a', 'two--hyphens', '-edge', 'space here', 'ümlaut']) expect(slugSchema.safeParse(bad).success).toBe(false)
  })

  it('accepts only #rrggbb brand colours', () => {
    const base = { name: 'Saltmarsh Sword Guild', slug: 'saltmarsh-sword-guild', town: 'Wrenmouth', about: '', primaryColor: '#1F3A4D', secondaryColor: '#d9ad4f' }
    expect(clubProfileSchema.parse(base).primaryColor).toBe('#1f3a4d')
    expect(fieldsOf(clubProfileSchema.safeParse({ ...base, secondaryColor: 'gold' }))).toEqual(['secondaryColor'])
  })

  it('asks an invitation for at least one known role', () => {
    expect(fieldsOf(invitationSchema.safeParse({ email: 'new@club.example', roles: [] }))).toEqual(['roles'])
    expect(fieldsOf(invitationSchema.safeParse({ email: 'new@club.example', roles: ['king'] }))).toEqual(['roles.0'])
  })
})
