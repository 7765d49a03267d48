import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { MIN_TEXT_CONTRAST, brandNotice, cardPalette, checkBrandColour, textPairs } from '../../../shared/cards/palette'
import { contrastRatio } from '../../../shared/utils/contrast'

const hex = fc.integer({ min: 0, max: 0xFFFFFF }).map(n => `#${n.toString(16).padStart(6, '0')}`)

// The contrast function itself is checked against WCAG 2.2's published values in
// tests/unit/contrast.test.ts; these tests check what the cards do with it.
describe('card colours', () => {
  it('keeps every text and background pair of a card at 4.5:1 or more, for any brand colours (WCAG 2.2 SC 1.4.3)', () => {
    fc.assert(fc.property(hex, hex, (primary, secondary) => {
      for (const pair of textPairs(cardPalette(primary, secondary))) {
        expect(contrastRatio(pair.fg, pair.bg), `${pair.what}: ${pair.fg} on ${pair.bg}`).toBeGreaterThanOrEqual(MIN_TEXT_CONTRAST)
      }
    }), { numRuns: 500 })
  })

  it('uses a brand colour as it is when its text reaches 4.5:1', () => {
    const check = checkBrandColour('primary', '#1F3A4D')
    expect(check).toMatchObject({ given: '#1f3a4d', used: '#1f3a4d', text: '#ffffff', adjusted: false })
  })

  it('adjusts #777777, on which white reaches only 4.48:1 (WCAG’s own example) and near-black less, to the nearest shade that passes', () => {
    const check = checkBrandColour('secondary', '#777777')
    expect(check.adjusted).toBe(true)
    expect(check.givenRatio).toBeLessThan(4.5)
    expect(check.ratio).toBeGreaterThanOrEqual(4.5)
    expect(check.used).toBe('#767676')
    expect(check.text).toBe('#ffffff')
  })

  it('explains an adjusted colour to the editor, and says nothing when none was', () => {
    expect(brandNotice(cardPalette('#1f3a4d', '#d9ad4f'))).toBeNull()
    const notice = brandNotice(cardPalette('#777777', '#d9ad4f'))
    expect(notice).toMatch(/primary colour #777777 reaches only 4\.48:1/)
    expect(notice).toMatch(/cards use #767676/)
    expect(notice).toMatch(/club profile/)
  })
})
