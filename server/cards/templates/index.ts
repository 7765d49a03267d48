import { cardPalette } from '../../../shared/cards/palette'
import type { CardInput } from '../../../shared/cards/types'
import { cardFrame, cardLayout } from './frame'
import type { CardNode } from './h'
import { fighterBody } from './fighter'
import { matchBody } from './match'
import { podiumBody } from './podium'
import { poolBody } from './pool'
import { summaryBody } from './summary'

/**
 * The element tree of a card: a pure function of its input (data, size, words and brand), so the
 * same input always draws the same picture, and the tree names the card in the store.
 */
export function cardElement(input: CardInput): CardNode {
  const palette = cardPalette(input.brand.primary, input.brand.secondary)
  const layout = cardLayout(input)
  const { data } = input
  const body = data.kind === 'match'
    ? matchBody(data, palette, layout)
    : data.kind === 'fighter'
      ? fighterBody(data, palette, layout)
      : data.kind === 'pool'
        ? poolBody(data, palette, layout)
        : data.kind === 'podium'
          ? podiumBody(data, palette, layout)
          : summaryBody(data, palette, layout)
  return cardFrame(input, palette, layout, body)
}
