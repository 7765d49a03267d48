import type { CardPalette } from '../../../shared/cards/palette'
import { PLACE_NAMES, ordinal } from '../../../shared/cards/text'
import type { PodiumCardData, PodiumPlace } from '../../../shared/cards/types'
import type { CardLayout } from './frame'
import { box, text } from './h'
import type { CardNode } from './h'

// The finals: the places once they are fenced, or the final four as they go in, with the rank
// each brought from the pools.

function place(p: PodiumPlace, data: PodiumCardData, palette: CardPalette, layout: CardLayout, height: number): CardNode {
  const { u } = layout
  const first = data.complete && p.place === 1
  const label = data.complete ? (PLACE_NAMES[p.place] ?? ordinal(p.place)) : p.seed === null ? 'Finalist' : `${ordinal(p.seed)} in pools`
  return box(
    {
      flexDirection: 'row',
      alignItems: 'center',
      height,
      padding: `0 ${28 * u}px`,
      borderRadius: 10 * u,
      backgroundColor: first ? palette.accent : palette.panel,
      color: first ? palette.accentText : palette.text,
      ...(layout.wide ? { flexGrow: 1, flexBasis: 0, flexDirection: 'column', alignItems: 'flex-start', justifyContent: 'center' } : {}),
    },
    text({ ...(layout.wide ? {} : { width: 230 * u }), fontSize: 30 * u, textTransform: 'uppercase', letterSpacing: 2 * u, color: first ? palette.accentText : palette.muted }, label),
    box(
      { flexDirection: 'column', flexShrink: 1 },
      text({ fontSize: (layout.wide ? 40 : 52) * u, fontWeight: 600, lineHeight: 1.1, textTransform: 'uppercase' }, p.fighter.name),
      text({ fontSize: 26 * u, color: first ? palette.accentText : palette.muted }, p.fighter.clubName),
    ),
  )
}

export function podiumBody(data: PodiumCardData, palette: CardPalette, layout: CardLayout): CardNode {
  const { u } = layout
  if (data.places.length === 0) {
    return text({ fontSize: 40 * u, color: palette.muted }, 'The finalists are not known yet.')
  }
  const gap = 18 * u
  if (layout.wide) {
    const height = Math.min(layout.body.height, 230 * u)
    return box({ flexDirection: 'row' }, ...data.places.flatMap((p, i) => [...(i ? [box({ width: gap })] : []), place(p, data, palette, layout, height)]))
  }
  const height = Math.floor(Math.min(150 * u, (layout.body.height - gap * (data.places.length - 1)) / data.places.length))
  return box({ flexDirection: 'column' }, ...data.places.flatMap((p, i) => [...(i ? [box({ height: gap })] : []), place(p, data, palette, layout, height)]))
}
