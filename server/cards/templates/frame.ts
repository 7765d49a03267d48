import { CARD_SIZES } from '../../../shared/cards/types'
import type { CardInput, CardSize } from '../../../shared/cards/types'
import type { CardPalette } from '../../../shared/cards/palette'
import { CARD_FONT_FAMILY } from '../render'
import { box, image, text } from './h'
import type { CardNode } from './h'

// What every card shares: the club's logo and name, the event, the headline, the caption and a
// band of the secondary colour, laid out for one of the four sizes. The kind's own part goes in
// the body, which gets the room that is left.

export interface CardLayout {
  size: CardSize
  width: number
  height: number
  /** 1 on a 1080-wide card; everything is measured in it. */
  u: number
  /** The link preview: short and wide. */
  wide: boolean
  /** Portrait and story: room to stack. */
  tall: boolean
  pad: number
  body: { width: number, height: number }
  headlineSize: number
}

// Stories are overlaid by the app's own controls at the top and bottom: the text keeps clear of
// about the top and bottom eighth. Our own margin, from looking at the platforms, not a standard.
const STORY_SAFE = 240

export const BAND = 16
export const HEADER = 84
const CAPTION = 34
export const GAP = 36

/** Headline size that keeps it to about two lines; Oswald's capitals average about half an em. */
function headlineSize(headline: string, width: number, base: number): number {
  const fits = (2 * width) / (Math.max(headline.length, 1) * 0.5)
  return Math.max(Math.round(base * 0.55), Math.min(base, Math.floor(fits)))
}

export function cardLayout(input: Pick<CardInput, 'size' | 'headline'>): CardLayout {
  const { width, height } = CARD_SIZES[input.size]
  const wide = input.size === 'link'
  const tall = input.size === 'portrait' || input.size === 'story'
  const u = wide ? 0.7 : width / 1080
  const pad = Math.round((wide ? 48 : 72) * (wide ? 1 : u))
  const top = input.size === 'story' ? STORY_SAFE : pad
  const bottom = input.size === 'story' ? STORY_SAFE : pad
  const innerWidth = width - 2 * pad
  const size = headlineSize(input.headline, innerWidth, Math.round((wide ? 100 : 92) * u))
  const lines = Math.min(2, Math.ceil((Math.max(input.headline.length, 1) * 0.5 * size) / innerWidth))
  const headlineHeight = Math.ceil(size * 1.1 * lines)
  const used = top + bottom + BAND + (HEADER + CAPTION + 3 * GAP) * u + headlineHeight
  return {
    size: input.size,
    width,
    height,
    u,
    wide,
    tall,
    pad,
    body: { width: innerWidth, height: Math.floor(height - used) },
    headlineSize: size,
  }
}

function initials(name: string): string {
  return name.split(/\s+/).filter(w => /^[A-Z0-9]/i.test(w)).slice(0, 2).map(w => w[0]!.toUpperCase()).join('') || '·'
}

function logo(input: CardInput, palette: CardPalette, size: number): CardNode {
  if (input.brand.logo) return image(input.brand.logo, size)
  return box(
    { width: size, height: size, backgroundColor: palette.accent, color: palette.accentText, alignItems: 'center', justifyContent: 'center', borderRadius: size / 2 },
    text({ fontSize: Math.round(size * 0.42), fontWeight: 600 }, initials(input.brand.clubName)),
  )
}

export function cardFrame(input: CardInput, palette: CardPalette, layout: CardLayout, body: CardNode): CardNode {
  const { u, pad } = layout
  const story = layout.size === 'story'
  const { context } = input.data
  const where = [context.eventName, context.tournamentName].filter(Boolean).join(' · ')
  const headline = text(
    { marginTop: GAP * u, fontSize: layout.headlineSize, fontWeight: 600, lineHeight: 1.1, textTransform: 'uppercase', letterSpacing: 0.5 * u },
    input.headline,
  )
  return box(
    {
      width: layout.width,
      height: layout.height,
      flexDirection: 'column',
      backgroundColor: palette.background,
      color: palette.text,
      fontFamily: CARD_FONT_FAMILY,
    },
    box(
      {
        flexGrow: 1,
        flexDirection: 'column',
        paddingLeft: pad,
        paddingRight: pad,
        paddingTop: story ? STORY_SAFE : pad,
        paddingBottom: story ? STORY_SAFE : pad,
      },
      box(
        { height: HEADER * u, alignItems: 'center' },
        logo(input, palette, Math.round(HEADER * u)),
        box(
          { flexDirection: 'column', marginLeft: 24 * u, flexGrow: 1, flexShrink: 1 },
          text({ fontSize: 30 * u, fontWeight: 600, letterSpacing: 2 * u, textTransform: 'uppercase' }, input.brand.clubName),
          text({ fontSize: 26 * u, color: palette.muted, marginTop: 2 * u }, where),
        ),
      ),
      // On the tall sizes the headline stays with the body, in the middle of the card.
      layout.tall ? null : headline,
      box(
        { flexGrow: 1, marginTop: GAP * u, flexDirection: 'column', justifyContent: 'center' },
        layout.tall ? headline : null,
        layout.tall ? box({ height: GAP * u * 1.5 }) : null,
        body,
      ),
      text({ marginTop: GAP * u, fontSize: 26 * u, color: palette.muted, height: CAPTION * u }, input.caption),
    ),
    box({ height: BAND, backgroundColor: palette.accent }),
  )
}

/** A figure with its label on a panel: the record, a rate, a count. */
export function tile(palette: CardPalette, u: number, valueSize: number, value: string, label: string, options: { accent?: boolean } = {}): CardNode {
  const bg = options.accent ? palette.accent : palette.panel
  const fg = options.accent ? palette.accentText : palette.text
  const labelColour = options.accent ? palette.accentText : palette.muted
  return box(
    { flexDirection: 'column', backgroundColor: bg, color: fg, padding: `${18 * u}px ${24 * u}px`, borderRadius: 10 * u, flexGrow: 1, flexBasis: 0 },
    text({ fontSize: valueSize, fontWeight: 600, lineHeight: 1.05 }, value),
    text({ fontSize: 24 * u, color: labelColour, textTransform: 'uppercase', letterSpacing: 1.5 * u, marginTop: 4 * u }, label),
  )
}

/** A small label in the accent colour, e.g. WINNER. */
export function badge(palette: CardPalette, u: number, label: string): CardNode {
  return box(
    { backgroundColor: palette.accent, color: palette.accentText, padding: `${6 * u}px ${16 * u}px`, borderRadius: 6 * u },
    text({ fontSize: 24 * u, fontWeight: 600, letterSpacing: 2 * u, textTransform: 'uppercase' }, label),
  )
}

/** Tiles in rows of `perRow`, with even gaps. */
export function tileGrid(u: number, perRow: number, tiles: CardNode[]): CardNode {
  const rows: CardNode[] = []
  for (let i = 0; i < tiles.length; i += perRow) {
    const items = tiles.slice(i, i + perRow)
    rows.push(box({ flexDirection: 'row', marginTop: i === 0 ? 0 : 20 * u }, ...items.flatMap((t, k) => (k === 0 ? [t] : [box({ width: 20 * u }), t]))))
  }
  return box({ flexDirection: 'column' }, ...rows)
}
