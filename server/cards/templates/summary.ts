import type { CardPalette } from '../../../shared/cards/palette'
import { wholePercent } from '../../../shared/cards/text'
import type { SummaryCardData } from '../../../shared/cards/types'
import { badge, tile, tileGrid } from './frame'
import type { CardLayout } from './frame'
import { box, text } from './h'
import type { CardNode } from './h'

// A tournament (or a whole event) in numbers: fighters, clubs, bouts and how many were doubles.

export function summaryBody(data: SummaryCardData, palette: CardPalette, layout: CardLayout): CardNode {
  const { u } = layout
  const valueSize = (layout.tall ? 104 : 72) * u
  const tiles = [
    tile(palette, u, valueSize, String(data.fighters), data.fighters === 1 ? 'Fighter' : 'Fighters'),
    tile(palette, u, valueSize, String(data.clubs), data.clubs === 1 ? 'Club' : 'Clubs'),
    tile(palette, u, valueSize, String(data.bouts), `Bouts in ${data.matches} ${data.matches === 1 ? 'match' : 'matches'}`),
    tile(palette, u, valueSize, wholePercent(data.doublesRate), `Doubles (${data.doubles})`, { accent: true }),
  ]
  return box(
    { flexDirection: 'column' },
    tileGrid(u, layout.wide ? 4 : 2, tiles),
    data.winner
      ? box(
          { flexDirection: 'row', alignItems: 'center', marginTop: 32 * u },
          badge(palette, u, 'Winner'),
          text({ fontSize: 40 * u, fontWeight: 600, marginLeft: 20 * u, textTransform: 'uppercase' }, data.winner.name),
          text({ fontSize: 26 * u, color: palette.muted, marginLeft: 16 * u }, data.winner.clubName),
        )
      : null,
  )
}
