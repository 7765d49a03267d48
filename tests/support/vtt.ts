// The W3C WebVTT validator's parser (webvtt-parser 2.2.0, https://github.com/w3c/webvtt.js), given the
// full table of HTML character references as its README asks for spec-compliant decoding
// (without it, "&amp;" reads back as "&;").
import { createRequire } from 'node:module'
import { WebVTTParser } from 'webvtt-parser'
import type { WebVTTCue, WebVTTNode } from 'webvtt-parser'

const entities = createRequire(import.meta.url)('webvtt-parser/html-entities.json') as Record<string, string>

export function parseVtt(text: string) {
  return new WebVTTParser(entities).parse(text, 'metadata')
}

/** A cue's text as a player shows it: the references decoded, tags (none expected) dropped. */
export function cueText(cue: WebVTTCue): string {
  const flat = (nodes: WebVTTNode[]): string => nodes.map(n => n.value ?? flat(n.children ?? [])).join('')
  return flat(cue.tree.children)
}
