// The same card as an HTML page, for the benchmark's browser side: the element tree the
// templates build, written out as HTML with inline styles, and Oswald from the same files.
import { readFileSync } from 'node:fs'
import { cardFontFiles } from '../server/cards/render'
import type { CardNode, CardStyle } from '../server/cards/templates/h'

// CSS properties whose plain numbers have no unit.
const UNITLESS = new Set(['fontWeight', 'lineHeight', 'flexGrow', 'flexShrink', 'opacity', 'zIndex'])

const escape = (text: string) => text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;')

function css(style: CardStyle): string {
  return Object.entries(style).map(([key, value]) => {
    const property = key.replace(/[A-Z]/g, c => `-${c.toLowerCase()}`)
    const text = typeof value === 'number' && !UNITLESS.has(key) ? `${value}px` : String(value)
    return `${property}:${text}`
  }).join(';')
}

export function cardHtml(node: CardNode | string): string {
  if (typeof node === 'string') return escape(node)
  const style = escape(css(node.props.style))
  if (node.type === 'img') return `<img src="${escape(node.props.src ?? '')}" width="${node.props.width}" height="${node.props.height}" style="${style}">`
  const { children } = node.props
  const inner = typeof children === 'string' ? escape(children) : (children ?? []).map(cardHtml).join('')
  return `<div style="${style}">${inner}</div>`
}

/** A page that has loaded Oswald (the Latin files), ready for cards to be put in its body. */
export function cardPageShell(): string {
  const faces = cardFontFiles().filter(f => !f.path.includes('latin-ext')).map(f =>
    `@font-face{font-family:Oswald;font-weight:${f.weight};src:url(data:font/woff;base64,${readFileSync(f.path).toString('base64')}) format('woff')}`)
  return `<!doctype html><html><head><meta charset="utf-8"><style>${faces.join('')}html,body{margin:0;padding:0}*{box-sizing:border-box}</style></head>`
    + '<body><div style="font-family:Oswald;font-weight:400">Oswald <b style="font-weight:600">Oswald</b></div></body></html>'
}
