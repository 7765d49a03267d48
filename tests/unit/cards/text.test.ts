import { describe, expect, it } from 'vitest'
import { cardAltText, cardDates, defaultHeadline, fileSlug, ordinal, wholePercent } from '../../../shared/cards/text'
import { cardRequestSchema, cardBatchSchema } from '../../../shared/schemas/cards'
import { sampleData, sampleInput } from '../../support/cards'

describe('card words', () => {
  it('writes the alt text of a match from its data: stage, result, score, clubs and bouts', () => {
    const input = sampleInput('match', 'square', 0)
    if (input.data.kind !== 'match') throw new Error('a match card was expected')
    const alt = cardAltText(input)
    const { a, b, score } = input.data
    expect(alt).toContain(`${a.name} (${a.clubName})`)
    expect(alt).toContain(`${b.name} (${b.clubName})`)
    expect(alt).toContain(`${score.a} to ${score.b}`)
    expect(alt).toContain(input.data.stage)
    expect(alt).toMatch(/Bouts: 1 /)
    expect(alt).toContain(`“${input.headline}”`)
  })

  it('names every fighter of a pool table in rank order in its alt text', () => {
    const input = sampleInput('pool', 'portrait', 1)
    if (input.data.kind !== 'pool') throw new Error('a pool card was expected')
    const alt = cardAltText(input)
    const at = input.data.rows.map(r => alt.indexOf(r.name))
    expect(at.every(i => i >= 0)).toBe(true)
    expect([...at].sort((x, y) => x - y)).toEqual(at)
  })

  it('says the doubles rate and the winner in a summary', () => {
    const data = sampleData('summary', 1)
    if (data.kind !== 'summary' || !data.winner) throw new Error('a summary with a winner was expected')
    const alt = cardAltText({ data, headline: defaultHeadline(data), caption: '' })
    expect(alt).toContain(`${Math.round(data.doublesRate! * 100)}%`)
    expect(alt).toContain(`Winner: ${data.winner.name}`)
  })

  it('formats dates, ordinals, rates and file names', () => {
    expect(cardDates('2026-10-10', '2026-10-10')).toBe('10 October 2026')
    expect(cardDates('2026-10-10', '2026-10-11')).toBe('10–11 October 2026')
    expect(cardDates('2026-09-30', '2026-10-01')).toBe('30 September – 1 October 2026')
    expect([1, 2, 3, 4, 11, 12, 13, 21, 22, 111].map(ordinal)).toEqual(['1st', '2nd', '3rd', '4th', '11th', '12th', '13th', '21st', '22nd', '111th'])
    expect(wholePercent(0.625)).toBe('63%')
    expect(wholePercent(null)).toBe('–')
    expect(fileSlug('Pool 1, match 3: Æsa Öberg v Dorrit Vane')).toBe('pool-1-match-3-sa-oberg-v-dorrit-vane')
  })
})

describe('card requests', () => {
  it('asks which match, fighter or pool a card is about, but not for the tournament’s own cards', () => {
    const missing = cardRequestSchema.safeParse({ tournamentId: 1, kind: 'match', size: 'square' })
    expect(missing.success).toBe(false)
    expect(missing.error?.issues[0]?.path).toEqual(['subjectId'])
    expect(cardRequestSchema.safeParse({ tournamentId: 1, kind: 'summary', size: 'link' }).success).toBe(true)
  })

  it('keeps headlines to one line of at most 80 characters and refuses unknown sizes', () => {
    const parsed = cardRequestSchema.parse({ tournamentId: 1, kind: 'podium', size: 'story', headline: '  The\nfinal   four ' })
    expect(parsed.headline).toBe('The final four')
    expect(cardRequestSchema.safeParse({ tournamentId: 1, kind: 'podium', size: 'story', headline: 'x'.repeat(81) }).success).toBe(false)
    expect(cardRequestSchema.safeParse({ tournamentId: 1, kind: 'podium', size: 'banner' }).success).toBe(false)
  })

  it('takes each size of a batch once', () => {
    expect(cardBatchSchema.safeParse({ tournamentId: 1, sizes: ['square', 'square'] }).success).toBe(false)
    expect(cardBatchSchema.safeParse({ tournamentId: 1, sizes: [] }).success).toBe(false)
    expect(cardBatchSchema.safeParse({ tournamentId: 1, sizes: ['square', 'link'] }).success).toBe(true)
  })
})
