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
const FONT_FILES: { file: string, weight: 400 | 600 }[] = [
  { file: 'oswald-latin-400-normal.woff', weight: 400 },
  { file: 'oswald-latin-ext-400-normal.woff', weight: 400 },
  { file: 'oswald-latin-600-normal.woff', weight: 600 },
  { file: 'oswald-latin-ext-600-normal.woff', weight: 600 },
]
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

export function cardFontFiles(): { path: string, weight: 400 | 600 }[] {
  return FONT_FILES.map(f => ({ path: packageFile(`@fontsource/oswald/files/${f.file}`), weight: f.weight }))
}

let ready: Promise<SatoriFont[]> | null = null

/** Loads the fonts and the WebAssembly module once; every render waits for it. */
export function cardRenderer(): Promise<SatoriFont[]> {
  ready ??= (async () => {
    await initWasm(readFileSync(packageFile('@resvg/resvg-wasm/index_bg.wasm')))
    return cardFontFiles().map(({ path, weight }) => ({ name: CARD_FONT_FAMILY, data: readFileSync(path), weight, style: 'normal' as const }))
  })()
  ready.catch(() => {
    ready = null
  })
  return ready
}

export async function renderSvg(element: CardNode, width: number, height: number): Promise<string> {
  const fonts = await cardRenderer()
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
