import { describe, expect, it } from 'vitest'
import { OVERLAY_CANVAS, OVERLAY_COLOURS, OVERLAY_SAFE, OVERLAY_TEXT_ON_PANEL, overlayVars } from '../../../overlays/palette'
import type { OverlayColour } from '../../../overlays/palette'
import { contrastRatio } from '../../../shared/utils/contrast'

const pairs = (Object.entries(OVERLAY_TEXT_ON_PANEL) as [OverlayColour, readonly OverlayColour[]][])
  .flatMap(([panel, texts]) => texts.map(text => ({ panel, text })))

describe('the overlay palette', () => {
  // WCAG 2.2, Success Criterion 1.4.3 (contrast, minimum): 4.5:1 for text, with the W3C's
  // relative-luminance formula (shared/utils/contrast.ts).
  it.each(pairs)('$text text on the $panel panel reaches 4.5:1 (WCAG 2.2 AA)', ({ panel, text }) => {
    expect(contrastRatio(OVERLAY_COLOURS[text], OVERLAY_COLOURS[panel])).toBeGreaterThanOrEqual(4.5)
  })

  it('lists a text colour for every panel the boards put text on', () => {
    expect(pairs.length).toBeGreaterThanOrEqual(10)
    for (const panel of ['night', 'slate', 'bone', 'gilt', 'red', 'blue'] as const) {
      expect(OVERLAY_TEXT_ON_PANEL[panel].length, panel).toBeGreaterThan(0)
    }
  })

  it('uses only opaque #rrggbb colours, so a panel is the only thing behind its text', () => {
    for (const hex of Object.values(OVERLAY_COLOURS)) expect(hex).toMatch(/^#[0-9a-f]{6}$/i)
  })

  // EBU R 95 (2008): the graphics-safe area is 90 % of the width and height, centred.
  it('puts the graphics-safe area at 90 % of 1920 × 1080, centred (EBU R 95)', () => {
    expect(OVERLAY_SAFE.right - OVERLAY_SAFE.left).toBe(OVERLAY_CANVAS.width * 0.9)
    expect(OVERLAY_SAFE.bottom - OVERLAY_SAFE.top).toBe(OVERLAY_CANVAS.height * 0.9)
    expect(OVERLAY_SAFE).toEqual({ left: 96, top: 54, right: 1824, bottom: 1026 })
  })

  it('hands every colour and size to the boards as a CSS variable', () => {
    const vars = overlayVars()
    expect(vars['--ov-night']).toBe(OVERLAY_COLOURS.night)
    expect(vars['--ov-red']).toBe('#B3261E')
    expect(vars['--ov-type-name']).toBe('44px')
    expect(vars['--ov-safe-left']).toBe('96px')
  })
})
