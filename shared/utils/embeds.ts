// Embeds in a breakdown's markdown: one per line, in double square brackets. Pure parsing only;
// the server turns each into HTML from live data when the post is shown.
//
//   [[clip 12]]                      a clip, played by our own player
//   [[pool 7 2]]                     pool 2 of tournament 7: its table as it stands
//   [[match 45]]                     a match: fighters, score and result
//   [[card match 45]]                a result card: match <id>, fighter <id> or event <event-slug>

export const EMBED_CARD_SUBJECTS = ['match', 'fighter', 'event'] as const
export type EmbedCardSubject = typeof EMBED_CARD_SUBJECTS[number]

export type Embed
  = | { kind: 'clip', clipId: number }
    | { kind: 'pool', tournamentId: number, poolNumber: number }
    | { kind: 'match', matchId: number }
    | { kind: 'card', subject: EmbedCardSubject, id: string }

export const EMBED_HELP: { kind: Embed['kind'], syntax: string, text: string }[] = [
  { kind: 'clip', syntax: '[[clip 12]]', text: 'A clip from the club’s footage, in the club’s player.' },
  { kind: 'pool', syntax: '[[pool 7 2]]', text: 'Pool 2 of tournament 7: its table as it stands when the page is read.' },
  { kind: 'match', syntax: '[[match 45]]', text: 'A match: both fighters, the score and the result.' },
  { kind: 'card', syntax: '[[card match 45]]', text: 'A result card (1200 × 630): match <id>, fighter <id> or event <event-slug>.' },
]

const LINE = /^\[\[\s*([a-z]+)((?:\s+[\w-]+)*)\s*\]\]$/
const ID = /^[1-9]\d{0,9}$/
const SLUG = /^[a-z0-9]+(?:-[a-z0-9]+)*$/

const id = (text: string | undefined) => (text !== undefined && ID.test(text) && Number(text) <= 2147483647 ? Number(text) : null)

/** An embed line's meaning; null for a line that is not one, or is one with a mistake. */
export function parseEmbed(line: string): Embed | null {
  const found = LINE.exec(line.trim())
  if (!found) return null
  const kind = found[1]
  const args = found[2]!.trim().split(/\s+/).filter(Boolean)
  if (kind === 'clip' && args.length === 1) {
    const clipId = id(args[0])
    return clipId === null ? null : { kind, clipId }
  }
  if (kind === 'match' && args.length === 1) {
    const matchId = id(args[0])
    return matchId === null ? null : { kind, matchId }
  }
  if (kind === 'pool' && args.length === 2) {
    const tournamentId = id(args[0])
    const poolNumber = id(args[1])
    return tournamentId === null || poolNumber === null ? null : { kind, tournamentId, poolNumber }
  }
  if (kind === 'card' && args.length === 2) {
    const subject = EMBED_CARD_SUBJECTS.find(s => s === args[0])
    const ref = args[1]!
    if (!subject) return null
    if (subject === 'event' ? SLUG.test(ref) && ref.length <= 48 : id(ref) !== null) return { kind, subject, id: ref }
  }
  return null
}

/** Looks like an embed (double brackets on a line of its own), whether or not it parses. */
export const looksLikeEmbed = (line: string) => /^\s*\[\[.*\]\]\s*$/.test(line)

export type BodyPart = { type: 'markdown', text: string } | { type: 'embed', embed: Embed | null, source: string }

/** Splits a body into markdown runs and embed lines (outside fenced code blocks). */
export function splitBody(body: string): BodyPart[] {
  const parts: BodyPart[] = []
  let run: string[] = []
  let fence: string | null = null
  const flush = () => {
    if (run.length > 0) parts.push({ type: 'markdown', text: run.join('\n') })
    run = []
  }
  for (const line of body.replace(/\r\n?/g, '\n').split('\n')) {
    const opener = /^\s{0,3}(`{3,}|~{3,})/.exec(line)
    if (opener) {
      if (fence === null) fence = opener[1]![0]!
      else if (opener[1]![0] === fence) fence = null
    }
    if (fence === null && !opener && looksLikeEmbed(line)) {
      flush()
      parts.push({ type: 'embed', embed: parseEmbed(line), source: line.trim() })
    }
    else {
      run.push(line)
    }
  }
  flush()
  return parts
}

/** The line to insert for an embed. */
export function embedLine(embed: Embed): string {
  switch (embed.kind) {
    case 'clip': return `[[clip ${embed.clipId}]]`
    case 'pool': return `[[pool ${embed.tournamentId} ${embed.poolNumber}]]`
    case 'match': return `[[match ${embed.matchId}]]`
    case 'card': return `[[card ${embed.subject} ${embed.id}]]`
  }
}
