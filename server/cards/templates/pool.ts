import type { CardPalette } from '../../../shared/cards/palette'
import { wholePercent } from '../../../shared/cards/text'
import type { PoolCardData, PoolCardRow } from '../../../shared/cards/types'
import type { CardLayout } from './frame'
import { box, text } from './h'
import type { CardNode } from './h'

// A pool's table, built from flex rows (satori has no table layout).

const signed = (n: number) => (n > 0 ? `+${n}` : n < 0 ? `−${-n}` : '0')

export function poolBody(data: PoolCardData, palette: CardPalette, layout: CardLayout): CardNode {
  const { u } = layout
  const rows = data.rows.length
  const rowHeight = Math.floor(Math.min(96 * u, layout.body.height / (rows + 0.8)))
  const big = Math.min(34 * u, rowHeight * 0.5)
  const small = Math.max(Math.min(22 * u, rowHeight * 0.36), 14)
  const numberWidth = 128 * u
  const cells = (row: PoolCardRow | null): CardNode[] => {
    const values = row
      ? [`${row.wins}–${row.losses}${row.draws ? `–${row.draws}` : ''}`, `${row.unharmed}/${row.bouts}`, wholePercent(row.survivalRate), signed(row.indicator)]
      : ['W–L', 'Unharmed', 'Survival', 'Ind.']
    return values.map(value => text({ width: numberWidth, justifyContent: 'flex-end', fontSize: row ? big : small, fontWeight: row ? 600 : 400 }, value))
  }
  const header = box(
    { flexDirection: 'row', alignItems: 'flex-end', paddingLeft: 20 * u, paddingRight: 20 * u, paddingBottom: 8 * u, color: palette.muted, textTransform: 'uppercase', letterSpacing: 1.5 * u },
    text({ width: 64 * u, fontSize: small }, '#'),
    text({ flexGrow: 1, fontSize: small }, 'Fighter'),
    ...cells(null),
  )
  const body = data.rows.map((row, i) => box(
    { flexDirection: 'row', alignItems: 'center', height: rowHeight, paddingLeft: 20 * u, paddingRight: 20 * u, backgroundColor: i % 2 === 0 ? palette.panel : palette.background, color: row.out ? palette.muted : palette.text },
    text({ width: 64 * u, fontSize: big, fontWeight: 600 }, row.out ? '–' : String(row.rank)),
    box(
      { flexDirection: 'column', flexGrow: 1, flexShrink: 1, flexBasis: 0 },
      text({ fontSize: big, fontWeight: 600, lineHeight: 1.1, textDecoration: row.out ? 'line-through' : 'none' }, row.name),
      rowHeight > 64 * u ? text({ fontSize: small, color: palette.muted, whiteSpace: 'nowrap' }, row.clubName) : null,
    ),
    ...cells(row),
  ))
  return box({ flexDirection: 'column' }, header, ...body)
}
