export type TextPart = { kind: 'text', value: string } | { kind: 'link', value: string }

const URL_PATTERN = /\bhttps?:\/\/[^\s<>"')\]]+/g

/** Splits plain text into text and http(s) links, so links render as anchors without v-html. */
export function linkify(text: string): TextPart[] {
  const parts: TextPart[] = []
  let last = 0
  for (const match of text.matchAll(URL_PATTERN)) {
    const start = match.index ?? 0
    // A sentence's final full stop or comma is not part of the address.
    const url = match[0].replace(/[.,;:!?]+$/, '')
    if (start > last) parts.push({ kind: 'text', value: text.slice(last, start) })
    parts.push({ kind: 'link', value: url })
    last = start + url.length
  }
  if (last < text.length) parts.push({ kind: 'text', value: text.slice(last) })
  return parts
}
