import type { CardPalette } from '../../../shared/cards/palette'
import { QUALIFICATION_LINES, ordinal, wholePercent } from '../../../shared/cards/text'
import type { FighterCardData } from '../../../shared/cards/types'
import { badge, tile, tileGrid } from './frame'
import type { CardLayout } from './frame'
import { box, text } from './h'
import type { CardNode } from './h'

// A fighter's pool summary: record, unharmed bouts, survival rate, rank, and whether they are
// through to the finals.

export function fighterBody(data: FighterCardData, palette: CardPalette, layout: CardLayout): CardNode {
  const { u } = layout
  const valueSize = (layout.tall ? 104 : 72) * u
  const record = `${data.record.wins}–${data.record.losses}${data.record.draws ? `–${data.record.draws}` : ''}`
  const rank = data.pool ? `${ordinal(data.pool.rank)} of ${data.pool.size}` : `${ordinal(data.overall.rank)} of ${data.overall.of}`
  const tiles = [
    tile(palette, u, valueSize, record, data.record.draws ? 'Won–lost–drawn' : 'Won–lost'),
    tile(palette, u, valueSize, `${data.unharmed}/${data.bouts}`, 'Unharmed bouts'),
    tile(palette, u, valueSize, wholePercent(data.survivalRate), 'Survival rate', { accent: true }),
    tile(palette, u, valueSize, rank, data.pool ? `In pool ${data.pool.number}` : 'Overall'),
  ]
  const overall = `${ordinal(data.overall.rank)} of ${data.overall.of} overall${data.overall.complete ? '' : ' so far'} · top ${data.topN} go to the finals`
  return box(
    { flexDirection: 'column' },
    layout.wide ? null : text({ fontSize: 30 * u, color: palette.muted, marginBottom: 24 * u }, data.fighter.clubName),
    tileGrid(u, layout.wide ? 4 : 2, tiles),
    box(
      { flexDirection: 'row', alignItems: 'center', marginTop: 28 * u },
      badge(palette, u, QUALIFICATION_LINES[data.qualification]),
      text({ fontSize: 26 * u, color: palette.muted, marginLeft: 20 * u, flexShrink: 1 }, overall),
    ),
  )
}
