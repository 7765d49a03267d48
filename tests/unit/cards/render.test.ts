import { PNG } from 'pngjs'
import { describe, expect, it } from 'vitest'
import { latinOnly, renderPng, textOf } from '../../../server/cards/render'
import { encodePng } from '../../../server/cards/png'
import { cardElement } from '../../../server/cards/templates'
import { GAP, HEADER, cardLayout } from '../../../server/cards/templates/frame'
import type { CardNode } from '../../../server/cards/templates/h'
import { CARD_KINDS, CARD_SIZE_NAMES, CARD_SIZES } from '../../../shared/cards/types'
import type { CardInput } from '../../../shared/cards/types'
import { sampleInput } from '../../support/cards'

// Decoded with pngjs, a PNG decoder written apart from ours, which checks the signature, every
// chunk's CRC and the zlib stream (PNG: ISO/IEC 15948 / W3C "Portable Network Graphics").
const decode = (png: Uint8Array) => PNG.sync.read(Buffer.from(png))

const draw = (input: CardInput, element: CardNode = cardElement(input)) =>
  renderPng(element, CARD_SIZES[input.size].width, CARD_SIZES[input.size].height)

/** The same card with every word taken out: the same boxes and colours, no text. */
function withoutText(node: CardNode): CardNode {
  const { children } = node.props
  return {
    ...node,
    props: {
      ...node.props,
      children: typeof children === 'string' ? '' : children?.map(c => (typeof c === 'string' ? '' : withoutText(c))),
    },
  }
}

const pixel = (png: PNG, x: number, y: number) => {
  const i = (y * png.width + x) * 4
  return [png.data[i]!, png.data[i + 1]!, png.data[i + 2]!]
}

describe('card rendering', () => {
  it.each(CARD_SIZE_NAMES)('draws every kind at exactly the %s size, as an independent decoder reads it', async (size) => {
    for (const kind of CARD_KINDS) {
      const png = decode(await draw(sampleInput(kind, size)))
      expect([png.width, png.height], `${kind} ${size}`).toEqual([CARD_SIZES[size].width, CARD_SIZES[size].height])
    }
  }, 60_000)

  it('gives a byte-identical PNG for the same data', async () => {
    const input = sampleInput('match', 'square', 3)
    const first = await draw(input)
    const again = await draw(structuredClone(input))
    expect(Buffer.from(again).equals(Buffer.from(first))).toBe(true)
  })

  it('lays out Latin text with the Latin files only, and takes the Latin Extended files for Ł or ő', () => {
    // Ranges from @fontsource/oswald's unicode.json; without its font a letter is drawn as a blank box.
    expect(latinOnly(textOf(cardElement(sampleInput('match', 'square', 1))))).toBe(true)
    expect(latinOnly('Maren Holt · 6–3 × ’')).toBe(true)
    expect(latinOnly('Łucja Kővári')).toBe(false)
    const element = cardElement({ ...sampleInput('fighter', 'link', 2), headline: 'Łucja Kővári' })
    expect(latinOnly(textOf(element))).toBe(false)
  })

  it('gives a different PNG when a score changes', async () => {
    const input = sampleInput('match', 'link', 3)
    const changed = structuredClone(input)
    if (changed.data.kind !== 'match') throw new Error('a match card was expected')
    changed.data.score.a += 1
    expect(Buffer.from(await draw(changed)).equals(Buffer.from(await draw(input)))).toBe(false)
  })

  it('really draws the text: the headline region holds text-coloured pixels that an empty card lacks', async () => {
    const input = { ...sampleInput('summary', 'square'), headline: 'HARVEST OPEN IN NUMBERS' }
    const element = cardElement(input)
    const full = decode(await draw(input, element))
    const empty = decode(await draw(input, withoutText(element)))
    const layout = cardLayout(input)
    const top = Math.round(layout.pad + (HEADER + GAP) * layout.u)
    const bottom = top + Math.round(layout.headlineSize)
    const background = pixel(empty, 5, 5)
    let differing = 0
    let inked = 0
    let area = 0
    for (let y = top; y < bottom; y++) {
      for (let x = layout.pad; x < layout.width / 2; x++) {
        area += 1
        const a = pixel(full, x, y)
        const b = pixel(empty, x, y)
        expect(b).toEqual(background)
        if (a.some((c, i) => c !== b[i])) differing += 1
        // The text is white on this brand's dark blue.
        if (a.every(c => c > 240)) inked += 1
      }
    }
    expect(differing / area).toBeGreaterThan(0.1)
    expect(inked / area).toBeGreaterThan(0.05)
    // Away from the words nothing changes: the band of the secondary colour at the foot.
    expect(pixel(full, layout.width / 2, layout.height - 4)).toEqual(pixel(empty, layout.width / 2, layout.height - 4))
  })

  it('draws the club logo when there is one', async () => {
    const { readFileSync } = await import('node:fs')
    const logo = `data:image/png;base64,${readFileSync(new URL('../../../server/database/seed/saltmarsh-crest.png', import.meta.url)).toString('base64')}`
    const plain = sampleInput('pool', 'link')
    const branded = { ...plain, brand: { ...plain.brand, logo } }
    const a = decode(await draw(plain))
    const b = decode(await draw(branded))
    const layout = cardLayout(plain)
    let differing = 0
    const size = Math.round(HEADER * layout.u)
    for (let y = layout.pad; y < layout.pad + size; y++) {
      for (let x = layout.pad; x < layout.pad + size; x++) if (pixel(a, x, y).some((c, i) => c !== pixel(b, x, y)[i])) differing += 1
    }
    expect(differing).toBeGreaterThan(size * size * 0.05)
  })
})

describe('PNG encoding', () => {
  it('round-trips pixels through an independent decoder (pngjs checks every CRC)', () => {
    const width = 7
    const height = 5
    const rgba = new Uint8Array(width * height * 4)
    for (let i = 0; i < width * height; i++) rgba.set([(i * 37) % 256, (i * 91) % 256, (i * 13) % 256, 255], i * 4)
    const png = decode(encodePng(rgba, width, height))
    expect([png.width, png.height]).toEqual([width, height])
    expect(Buffer.from(png.data).equals(Buffer.from(rgba))).toBe(true)
  })

  it('refuses a pixel buffer of the wrong length', () => {
    expect(() => encodePng(new Uint8Array(10), 2, 2)).toThrow(/16 bytes/)
  })
})
