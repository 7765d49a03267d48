import { describe, expect, it } from 'vitest'
import { embedLine, parseEmbed, splitBody } from '../../shared/utils/embeds'

describe('breakdown embeds', () => {
  it('reads each kind of embed line', () => {
    expect(parseEmbed('[[clip 12]]')).toEqual({ kind: 'clip', clipId: 12 })
    expect(parseEmbed('  [[ pool 7 2 ]]  ')).toEqual({ kind: 'pool', tournamentId: 7, poolNumber: 2 })
    expect(parseEmbed('[[match 45]]')).toEqual({ kind: 'match', matchId: 45 })
    expect(parseEmbed('[[card match 45]]')).toEqual({ kind: 'card', subject: 'match', id: '45' })
    expect(parseEmbed('[[card event wrenmouth-harvest-open]]')).toEqual({ kind: 'card', subject: 'event', id: 'wrenmouth-harvest-open' })
  })

  it('refuses mistyped embeds rather than guessing', () => {
    for (const line of ['[[clip]]', '[[clip 0]]', '[[clip 12 13]]', '[[clip x]]', '[[pool 7]]', '[[match -1]]', '[[card bracket 3]]',
      '[[card match abc]]', '[[card event Bad_Slug]]', '[[video 3]]', '[[clip 99999999999]]', 'see [[clip 12]] here']) {
      expect(parseEmbed(line), line).toBeNull()
    }
  })

  it('writes the line the parser reads back', () => {
    for (const embed of [
      { kind: 'clip', clipId: 3 }, { kind: 'pool', tournamentId: 4, poolNumber: 1 }, { kind: 'match', matchId: 9 },
      { kind: 'card', subject: 'fighter', id: '17' },
    ] as const) expect(parseEmbed(embedLine(embed))).toEqual(embed)
  })

  it('splits a body into markdown runs and embed lines, leaving code blocks alone', () => {
    const parts = splitBody('# Pool two\n\nA fine parry.\n[[clip 4]]\nThen:\n```\n[[clip 5]]\n```\n[[nonsense]]')
    expect(parts.map(p => p.type)).toEqual(['markdown', 'embed', 'markdown', 'embed'])
    expect(parts[1]).toMatchObject({ embed: { kind: 'clip', clipId: 4 } })
    expect(parts[2]).toMatchObject({ text: 'Then:\n```\n[[clip 5]]\n```' })
    expect(parts[3]).toMatchObject({ embed: null, source: '[[nonsense]]' })
  })
})
