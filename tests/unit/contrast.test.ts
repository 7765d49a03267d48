import { describe, expect, it } from 'vitest'
import { contrastRatio, passesAA, relativeLuminance, textColorOn } from '../../shared/utils/contrast'

// Source: W3C WCAG 2.2, definitions of relative luminance and contrast ratio, and
// Success Criterion 1.4.3 (AA: 4.5:1, 3:1 for large text). Check values from ../shared/DOMAIN.md.
describe('WCAG 2.2 contrast', () => {
  it('gives 21:1 for black on white, the largest possible ratio (WCAG 2.2)', () => {
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 10)
  })

  it('gives 1:1 for a colour against itself (WCAG 2.2)', () => {
    expect(contrastRatio('#a2731f', '#a2731f')).toBe(1)
  })

  it('rates #777777 on white at 4.48:1, which fails AA for normal text (WCAG 2.2)', () => {
    expect(contrastRatio('#777777', '#ffffff')).toBeCloseTo(4.48, 2)
    expect(passesAA('#777777', '#ffffff')).toBe(false)
    expect(passesAA('#777777', '#ffffff', true)).toBe(true)
  })

  it('rates #767676 on white at 4.54:1, which passes AA (WCAG 2.2)', () => {
    expect(contrastRatio('#767676', '#ffffff')).toBeCloseTo(4.54, 2)
    expect(passesAA('#767676', '#ffffff')).toBe(true)
  })

  it('uses the sRGB luminance coefficients 0.2126, 0.7152, 0.0722 (WCAG 2.2)', () => {
    expect(relativeLuminance('#ff0000')).toBeCloseTo(0.2126, 4)
    expect(relativeLuminance('#00ff00')).toBeCloseTo(0.7152, 4)
    expect(relativeLuminance('#0000ff')).toBeCloseTo(0.0722, 4)
  })

  it('is symmetric in its arguments', () => {
    expect(contrastRatio('#1f3a4d', '#d9ad4f')).toBe(contrastRatio('#d9ad4f', '#1f3a4d'))
  })

  it('picks the text colour with the higher contrast', () => {
    expect(textColorOn('#1f3a4d')).toBe('#ffffff')
    expect(textColorOn('#d9ad4f')).toBe('#12151a')
  })

  it('refuses anything but #rrggbb', () => {
    expect(() => contrastRatio('red', '#ffffff')).toThrow(/#rrggbb/)
  })
})
