import type { CardPalette } from '../../../shared/cards/palette'
import type { CardBout, CardFighter, MatchCardData } from '../../../shared/cards/types'
import { badge } from './frame'
import type { CardLayout } from './frame'
import { box, text } from './h'
import type { CardNode } from './h'

// A match result: both fighters with their clubs, the score, and the strip of bouts (first-hit)
// or exchanges (points), one column each, showing who scored in it.

const MARKS: Record<CardBout['kind'], string> = { clean: '', afterblow: 'AB', double: 'D', other: '' }

function winnerLabel(data: MatchCardData, side: 'a' | 'b'): string | null {
  if (data.status === 'forfeit') return data.forfeitedBy === side ? null : 'Won by forfeit'
  if (data.result === side) return 'Winner'
  if (data.result === 'draw') return 'Draw'
  return null
}

function fighterBlock(data: MatchCardData, side: 'a' | 'b', palette: CardPalette, layout: CardLayout): CardNode {
  const { u } = layout
  const fighter: CardFighter = data[side]
  const align = side === 'a' ? 'flex-start' : 'flex-end'
  const label = winnerLabel(data, side)
  return box(
    { flexDirection: 'column', alignItems: align, flexGrow: 1, flexBasis: 0, flexShrink: 1 },
    text({ fontSize: (layout.wide ? 64 : 58) * u, fontWeight: 600, lineHeight: 1.05, textAlign: side === 'a' ? 'left' : 'right', textTransform: 'uppercase' }, fighter.name),
    text({ fontSize: 28 * u, color: palette.muted, marginTop: 8 * u, textAlign: side === 'a' ? 'left' : 'right' }, fighter.clubName),
    label ? box({ marginTop: 16 * u }, badge(palette, u, label)) : box({ height: 1 }),
  )
}

function strip(data: MatchCardData, palette: CardPalette, layout: CardLayout): CardNode | null {
  if (data.bouts.length === 0) return null
  const { u } = layout
  const labelWidth = 150 * u
  const gap = 8 * u
  const room = layout.body.width - labelWidth
  const cell = Math.min(110 * u, Math.floor((room - gap * data.bouts.length) / data.bouts.length))
  const cellHeight = Math.round(56 * u)
  const fontSize = Math.min(30 * u, cell * 0.45)
  const surname = (f: CardFighter) => f.name.split(/\s+/).pop() ?? f.name
  const row = (side: 'a' | 'b') => box(
    { flexDirection: 'row', alignItems: 'center', marginTop: side === 'b' ? gap : 0 },
    text({ width: labelWidth, fontSize: 26 * u, color: palette.muted, textTransform: 'uppercase' }, surname(data[side])),
    ...data.bouts.map((bout) => {
      const scored = bout.points[side] > 0
      return box(
        { width: cell, height: cellHeight, marginRight: gap, alignItems: 'center', justifyContent: 'center', borderRadius: 6 * u, backgroundColor: scored ? palette.accent : palette.panel, color: scored ? palette.accentText : palette.muted },
        text({ fontSize, fontWeight: 600 }, scored ? `+${bout.points[side]}` : bout.hit[side] ? '×' : '·'),
      )
    }),
  )
  const numbers = box(
    { flexDirection: 'row', marginTop: 8 * u },
    box({ width: labelWidth }),
    ...data.bouts.map(bout => text(
      { width: cell, marginRight: gap, justifyContent: 'center', fontSize: Math.min(22 * u, cell * 0.35), color: palette.muted },
      MARKS[bout.kind] ? `${bout.number} ${MARKS[bout.kind]}` : String(bout.number),
    )),
  )
  const kinds = new Set(data.bouts.map(b => b.kind))
  const legend = [kinds.has('double') ? 'D double' : '', kinds.has('afterblow') ? 'AB afterblow' : '', '× hit'].filter(Boolean).join(' · ')
  return box(
    { flexDirection: 'column', marginTop: (layout.tall ? 72 : 40) * u },
    text({ fontSize: 24 * u, color: palette.muted, textTransform: 'uppercase', letterSpacing: 2 * u, marginBottom: 10 * u }, `${data.format === 'first-hit' ? 'Bouts' : 'Exchanges'} · ${legend}`),
    row('a'),
    row('b'),
    numbers,
  )
}

export function matchBody(data: MatchCardData, palette: CardPalette, layout: CardLayout): CardNode {
  const { u } = layout
  const score = data.status === 'forfeit' ? 'Forfeit' : `${data.score.a}–${data.score.b}`
  return box(
    { flexDirection: 'column' },
    box(
      { flexDirection: 'row', alignItems: 'flex-start' },
      fighterBlock(data, 'a', palette, layout),
      text({ fontSize: (data.status === 'forfeit' ? 64 : layout.wide ? 140 : 150) * u, fontWeight: 600, lineHeight: 1, padding: `0 ${28 * u}px`, color: palette.text }, score),
      fighterBlock(data, 'b', palette, layout),
    ),
    strip(data, palette, layout),
  )
}
