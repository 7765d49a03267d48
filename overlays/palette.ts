// The boards' colours and sizes, in one place: the stage turns them into CSS variables, and the
// unit tests check every text colour against the panel it sits on.
import { SIDE_COLOURS } from '#shared/live/types'

/** Opaque panel and text colours of the boards (our own palette). */
export const OVERLAY_COLOURS = {
  night: '#101419',
  slate: '#1b222b',
  bone: '#f2ede3',
  mist: '#a9b3bf',
  gilt: '#e2b85c',
  ink: '#101419',
  red: SIDE_COLOURS.a.hex,
  blue: SIDE_COLOURS.b.hex,
  white: '#ffffff',
} as const

export type OverlayColour = keyof typeof OVERLAY_COLOURS

/** Every text colour the boards use, with each panel it is set on. */
export const OVERLAY_TEXT_ON_PANEL: Readonly<Record<OverlayColour, readonly OverlayColour[]>> = {
  night: ['bone', 'mist', 'gilt'],
  slate: ['bone', 'mist', 'gilt'],
  bone: ['ink'],
  gilt: ['ink'],
  red: ['white'],
  blue: ['white'],
  mist: [],
  ink: [],
  white: [],
}

/** The 1920 × 1080 canvas and its graphics-safe area (EBU R 95: 90 % of each dimension, centred). */
export const OVERLAY_CANVAS = { width: 1920, height: 1080 } as const
export const OVERLAY_SAFE = { left: 96, top: 54, right: 1824, bottom: 1026 } as const

/** Type sizes in canvas pixels. */
export const OVERLAY_TYPE = {
  label: 24,
  small: 26,
  body: 32,
  name: 44,
  score: 76,
  title: 40,
  hero: 72,
} as const

/** The stage's CSS variables: `--ov-<colour>`, `--ov-type-<size>`, `--ov-safe-<edge>`. */
export function overlayVars(): Record<string, string> {
  const vars: Record<string, string> = {}
  for (const [name, hex] of Object.entries(OVERLAY_COLOURS)) vars[`--ov-${name}`] = hex
  for (const [name, px] of Object.entries(OVERLAY_TYPE)) vars[`--ov-type-${name}`] = `${px}px`
  for (const [name, px] of Object.entries(OVERLAY_SAFE)) vars[`--ov-safe-${name}`] = `${px}px`
  return vars
}
