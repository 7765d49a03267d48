import { contrastRatio, parseHexColor, textColorOn } from '../utils/contrast'

// The colours of a card, from the club's two brand colours. All text on a card is drawn in one of
// the pairs below, and every pair reaches 4.5:1 (WCAG 2.2, Success Criterion 1.4.3, AA for normal
// text). A brand colour on which neither near-black nor white text reaches 4.5:1 is not refused:
// the card uses the nearest shade that does (darker under white text, or lighter under dark text,
// whichever is the smaller change), and the studio says so. Refusing would leave the editor
// unable to make any card until the admin changed the club's colours.

export const MIN_TEXT_CONTRAST = 4.5

export interface BrandColourCheck {
  role: 'primary' | 'secondary'
  /** The colour in the club profile. */
  given: string
  /** The colour the cards use. */
  used: string
  text: string
  /** Contrast of the text on the colour as given. */
  givenRatio: number
  /** Contrast of the text on the colour used. */
  ratio: number
  adjusted: boolean
}

export interface CardPalette {
  background: string
  text: string
  /** Secondary text (clubs, labels) on the background and on panels. */
  muted: string
  /** Rows and tiles set off from the background. */
  panel: string
  accent: string
  accentText: string
  checks: BrandColourCheck[]
}

const hex = (rgb: readonly number[]) => `#${rgb.map(c => Math.round(Math.min(255, Math.max(0, c))).toString(16).padStart(2, '0')).join('')}`

/** `a` moved towards `b` by `t` (0–1), channel by channel in sRGB. */
export function mixColours(a: string, b: string, t: number): string {
  const x = parseHexColor(a)
  const y = parseHexColor(b)
  return hex(x.map((c, i) => c + (y[i]! - c) * t))
}

/** The shade of `colour` nearest to it towards `towards` on which `text` reaches the minimum. */
function shadeFor(colour: string, text: string, towards: string): { colour: string, steps: number } {
  for (let step = 0; step <= 100; step++) {
    const candidate = mixColours(colour, towards, step / 100)
    if (contrastRatio(text, candidate) >= MIN_TEXT_CONTRAST) return { colour: candidate, steps: step }
  }
  return { colour: towards, steps: 101 }
}

/** A brand colour as the cards use it: its best text colour, and the colour adjusted if the pair falls short. */
export function checkBrandColour(role: BrandColourCheck['role'], given: string): BrandColourCheck {
  const colour = given.toLowerCase()
  const text = textColorOn(colour)
  const givenRatio = contrastRatio(text, colour)
  if (givenRatio >= MIN_TEXT_CONTRAST) return { role, given: colour, used: colour, text, givenRatio, ratio: givenRatio, adjusted: false }
  const darker = shadeFor(colour, '#ffffff', '#000000')
  const lighter = shadeFor(colour, '#12151a', '#ffffff')
  const pick = darker.steps <= lighter.steps ? { ...darker, text: '#ffffff' } : { ...lighter, text: '#12151a' }
  return { role, given: colour, used: pick.colour, text: pick.text, givenRatio, ratio: contrastRatio(pick.text, pick.colour), adjusted: true }
}

/** The largest mix of `from` towards `to` (at most `t`) that keeps `text` readable on every background given. */
function readableMix(from: string, to: string, t: number, pairs: (candidate: string) => [string, string][]): string {
  for (let k = Math.round(t * 100); k > 0; k--) {
    const candidate = mixColours(from, to, k / 100)
    if (pairs(candidate).every(([fg, bg]) => contrastRatio(fg, bg) >= MIN_TEXT_CONTRAST)) return candidate
  }
  return from
}

export function cardPalette(primary: string, secondary: string): CardPalette {
  const main = checkBrandColour('primary', primary)
  const accent = checkBrandColour('secondary', secondary)
  const background = main.used
  const text = main.text
  const panel = readableMix(background, text, 0.1, candidate => [[text, candidate]])
  const muted = readableMix(text, background, 0.3, candidate => [[candidate, background], [candidate, panel]])
  return { background, text, muted, panel, accent: accent.used, accentText: accent.text, checks: [main, accent] }
}

/** Every pair of text and background colour a card draws, for the contrast check. */
export function textPairs(palette: CardPalette): { fg: string, bg: string, what: string }[] {
  return [
    { fg: palette.text, bg: palette.background, what: 'text on the background' },
    { fg: palette.muted, bg: palette.background, what: 'secondary text on the background' },
    { fg: palette.text, bg: palette.panel, what: 'text on a panel' },
    { fg: palette.muted, bg: palette.panel, what: 'secondary text on a panel' },
    { fg: palette.accentText, bg: palette.accent, what: 'text on the accent colour' },
  ]
}

/** The studio's explanation of a brand colour the cards had to adjust; null when none was. */
export function brandNotice(palette: CardPalette): string | null {
  const adjusted = palette.checks.filter(c => c.adjusted)
  if (adjusted.length === 0) return null
  const lines = adjusted.map(c => `the ${c.role} colour ${c.given} reaches only ${c.givenRatio.toFixed(2)}:1 with any text colour, so cards use ${c.used} (${c.ratio.toFixed(2)}:1)`)
  return `To keep every word readable (WCAG 2.2 asks 4.5:1 for text), ${lines.join('; ')}. A club admin can choose other brand colours in the club profile.`
}
