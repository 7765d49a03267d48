// WCAG 2.2 relative luminance and contrast ratio (W3C, "Web Content Accessibility Guidelines 2.2",
// definitions of "relative luminance" and "contrast ratio").

const HEX = /^#([0-9a-f]{6})$/i

export function parseHexColor(hex: string): [number, number, number] {
  const match = HEX.exec(hex.trim())
  if (!match) throw new Error(`Not a #rrggbb colour: ${hex}`)
  const n = Number.parseInt(match[1]!, 16)
  return [(n >> 16) & 255, (n >> 8) & 255, n & 255]
}

function channel(c8: number): number {
  const c = c8 / 255
  // WCAG 2.2 uses 0.04045 (the sRGB standard's threshold); WCAG 2.0 printed 0.03928. The
  // difference never changes an 8-bit result.
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4
}

export function relativeLuminance(hex: string): number {
  const [r, g, b] = parseHexColor(hex)
  return 0.2126 * channel(r) + 0.7152 * channel(g) + 0.0722 * channel(b)
}

export function contrastRatio(a: string, b: string): number {
  const la = relativeLuminance(a)
  const lb = relativeLuminance(b)
  const [hi, lo] = la > lb ? [la, lb] : [lb, la]
  return (hi + 0.05) / (lo + 0.05)
}

/** WCAG AA: 4.5:1 for normal text, 3:1 for large text. */
export function passesAA(fg: string, bg: string, large = false): boolean {
  return contrastRatio(fg, bg) >= (large ? 3 : 4.5)
}

/** The text colour (near-black or white) that reads best on a background. */
export function textColorOn(bg: string): '#12151a' | '#ffffff' {
  return contrastRatio('#ffffff', bg) >= contrastRatio('#12151a', bg) ? '#ffffff' : '#12151a'
}
