import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { Resvg, initWasm } from '@resvg/resvg-wasm'
import satori from 'satori'
import { encodePng } from './png'
import type { CardNode } from './templates/h'

// The one renderer of cards: satori lays the element tree out into an SVG, resvg (WebAssembly)
// draws it, and ./png.ts encodes the PNG. It reads no database and no Nitro state, so the app, its worker
// threads and the benchmark all use it as it is. The WebAssembly module is initialised once per
// process or thread: a second initialisation throws.

type SatoriFont = Parameters<typeof satori>[1]['fonts'][number]

/** Oswald, as shipped with the app by @fontsource: Latin and Latin Extended, regular and semibold. */
const FONT_FILES: { file: string, weight: 400 | 600, subset: 'latin' | 'latin-ext' }[] = [
  { file: 'oswald-latin-400-normal.woff', weight: 400, subset: 'latin' },
  { file: 'oswald-latin-ext-400-normal.woff', weight: 400, subset: 'latin-ext' },
  { file: 'oswald-latin-600-normal.woff', weight: 600, subset: 'latin' },
  { file: 'oswald-latin-ext-600-normal.woff', weight: 600, subset: 'latin-ext' },
]

// The code points of @fontsource's "latin" subset (its unicode.json). A card whose text stays
// inside it is laid out with the two Latin files only: satori looks every glyph up in each font
// of a family, and the Latin Extended files almost doubled its time on a card.
const LATIN: [number, number][] = [[0x0, 0xFF], [0x131, 0x131], [0x152, 0x153], [0x2BB, 0x2BC], [0x2C6, 0x2C6], [0x2DA, 0x2DA], [0x2DC, 0x2DC], [0x304, 0x304], [0x308, 0x308], [0x329, 0x329], [0x2000, 0x206F], [0x20AC, 0x20AC], [0x2122, 0x2122], [0x2191, 0x2191], [0x2193, 0x2193], [0x2212, 0x2212], [0x2215, 0x2215], [0xFEFF, 0xFEFF], [0xFFFD, 0xFFFD]]

/** Whether the text of a card stays inside @fontsource's Latin subset. */
export function latinOnly(text: string): boolean {
  for (const ch of text) {
    const code = ch.codePointAt(0)!
    if (!LATIN.some(([from, to]) => code >= from && code <= to)) return false
  }
  return true
}

/** Every string drawn by an element tree, joined. */
export function textOf(node: unknown): string {
  if (typeof node === 'string' || typeof node === 'number') return String(node)
  if (Array.isArray(node)) return node.map(textOf).join('')
  if (node && typeof node === 'object' && 'props' in node) return textOf((node as { props?: { children?: unknown } }).props?.children)
  return ''
}
export const CARD_FONT_FAMILY = 'Oswald'

// Where to look for packages: beside this file (the tests, the benchmark, worker threads) or
// beside the entry script (the built server, whose bundle has no real import.meta.url; its
// node_modules holds the traced files, see nitro.externals in nuxt.config.ts).
const bases = [import.meta.url, process.argv[1]].filter((b): b is string => Boolean(b) && !String(b).startsWith('file:///_entry'))

/** A file a package exports, found the way Node finds the package itself. */
export function packageFile(specifier: string): string {
  let failure: unknown
  for (const base of bases) {
    try {
      return createRequire(base).resolve(specifier)
    }
    catch (err) {
      failure = err
    }
  }
  throw failure ?? new Error(`${specifier} not found`)
}

export function cardFontFiles(): { path: string, weight: 400 | 600, subset: 'latin' | 'latin-ext' }[] {
  return FONT_FILES.map(f => ({ path: packageFile(`@fontsource/oswald/files/${f.file}`), weight: f.weight, subset: f.subset }))
}

// Two fixed arrays: satori caches what it learns of a font by the array it was given.
interface CardFonts { all: SatoriFont[], latin: SatoriFont[] }
let ready: Promise<CardFonts> | null = null

/** Loads the fonts and the WebAssembly module once; every render waits for it. */
export function cardRenderer(): Promise<CardFonts> {
  ready ??= (async () => {
    await initWasm(readFileSync(packageFile('@resvg/resvg-wasm/index_bg.wasm')))
    const files = cardFontFiles().map(f => ({ ...f, font: { name: CARD_FONT_FAMILY, data: readFileSync(f.path), weight: f.weight, style: 'normal' as const } }))
    return { all: files.map(f => f.font), latin: files.filter(f => f.subset === 'latin').map(f => f.font) }
  })()
  ready.catch(() => {
    ready = null
  })
  return ready
}

export async function renderSvg(element: CardNode, width: number, height: number): Promise<string> {
  const set = await cardRenderer()
  const fonts = latinOnly(textOf(element)) ? set.latin : set.all
  // satori's types want a React element; the tree is the same plain { type, props } shape.
  return satori(element as unknown as Parameters<typeof satori>[0], { width, height, fonts })
}

export function svgToPng(svg: string): Uint8Array {
  const resvg = new Resvg(svg, { font: { loadSystemFonts: false }, fitTo: { mode: 'original' } })
  try {
    const image = resvg.render()
    try {
      return encodePng(image.pixels, image.width, image.height)
    }
    finally {
      image.free()
    }
  }
  finally {
    resvg.free()
  }
}

/** The PNG of a card's element tree at its exact size. */
export async function renderPng(element: CardNode, width: number, height: number): Promise<Uint8Array> {
  return svgToPng(await renderSvg(element, width, height))
}
