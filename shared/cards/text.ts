import type { CardData, CardFighter, CardInput, CardQualification, MatchCardData, PodiumPlace } from './types'

// The words on and about a card: the headline and caption it starts with, and the alt text that
// describes it to someone who cannot see it. All written from the card's data.

const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December']

/** "10 October 2026", "10–11 October 2026" or "30 September – 1 October 2026", from ISO dates. */
export function cardDates(startsOn: string, endsOn: string): string {
  const parse = (iso: string) => {
    const [y, m, d] = iso.split('-').map(Number)
    return { y: y!, m: MONTHS[(m ?? 1) - 1] ?? '', d: d! }
  }
  const a = parse(startsOn)
  const b = parse(endsOn)
  if (startsOn === endsOn) return `${a.d} ${a.m} ${a.y}`
  if (a.y === b.y && a.m === b.m) return `${a.d}–${b.d} ${b.m} ${b.y}`
  if (a.y === b.y) return `${a.d} ${a.m} – ${b.d} ${b.m} ${b.y}`
  return `${a.d} ${a.m} ${a.y} – ${b.d} ${b.m} ${b.y}`
}

/** "58%" for 0.58; a dash before the first bout. */
export function wholePercent(rate: number | null): string {
  return rate === null ? '–' : `${Math.round(rate * 100)}%`
}

export function ordinal(n: number): string {
  const tens = n % 100
  if (tens >= 11 && tens <= 13) return `${n}th`
  return `${n}${({ 1: 'st', 2: 'nd', 3: 'rd' } as Record<number, string>)[n % 10] ?? 'th'}`
}

export const PLACE_NAMES: Record<number, string> = { 1: 'First', 2: 'Second', 3: 'Third', 4: 'Fourth' }

export const QUALIFICATION_LINES: Record<CardQualification, string> = {
  'qualified': 'Through to the finals',
  'in contention': 'Still in contention',
  'out': 'Out of the finals',
  'withdrawn': 'Withdrawn',
  'expelled': 'Expelled',
}

/** "Hedda Crane beat Alder Mossley", "… drew with …", or the pairing while the match is open. */
export function matchOutcome(data: MatchCardData): string {
  const { a, b } = data
  if (data.status === 'forfeit' && data.forfeitedBy) {
    const [winner, loser] = data.forfeitedBy === 'a' ? [b, a] : [a, b]
    return `${winner.name} won by forfeit against ${loser.name}`
  }
  switch (data.result) {
    case 'a': return `${a.name} beat ${b.name}`
    case 'b': return `${b.name} beat ${a.name}`
    case 'draw': return `${a.name} and ${b.name} drew`
    case 'both-lose': return `${a.name} and ${b.name} both lost on doubles`
    default: return `${a.name} against ${b.name}`
  }
}

export function defaultHeadline(data: CardData): string {
  switch (data.kind) {
    case 'match': return data.result === null && data.status !== 'forfeit' ? `${data.stage}: under way` : `${data.stage}: result`
    case 'fighter': return data.fighter.name
    case 'pool': return `Pool ${data.number}${data.complete ? ' final table' : ' table'}`
    case 'podium': return data.complete ? 'The podium' : 'The final four'
    case 'summary': return data.context.tournamentName ? `${data.context.tournamentName} in numbers` : 'The event in numbers'
  }
}

export function defaultCaption(data: CardData): string {
  const { eventName, dates } = data.context
  return [eventName, dates].filter(Boolean).join(' · ')
}

const fighterWithClub = (f: CardFighter) => `${f.name} (${f.clubName})`
const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`

function placeLine(places: PodiumPlace[], complete: boolean): string {
  if (!complete) return places.map(p => `${fighterWithClub(p.fighter)}${p.seed === null ? '' : `, ${ordinal(p.seed)} from the pools`}`).join('; ')
  return places.map(p => `${(PLACE_NAMES[p.place] ?? ordinal(p.place)).toLowerCase()}, ${fighterWithClub(p.fighter)}`).join('; ')
}

function stripLine(data: MatchCardData): string {
  if (data.bouts.length === 0) return ''
  const word = data.format === 'first-hit' ? 'Bouts' : 'Exchanges'
  const items = data.bouts.map((bout) => {
    const who = bout.kind === 'double' ? 'double' : bout.points.a > bout.points.b ? data.a.name : bout.points.b > bout.points.a ? data.b.name : 'no points'
    const extra = bout.kind === 'afterblow' ? ' with an afterblow' : ''
    return `${bout.number} ${who}${extra}`
  })
  return ` ${word}: ${items.join(', ')}.`
}

/** What the card shows, in sentences: the editor may change it, this is where it starts. */
export function cardAltText(input: Pick<CardInput, 'data' | 'headline' | 'caption'>): string {
  const { data } = input
  const where = data.context.tournamentName ? `${data.context.tournamentName}, ${data.context.eventName}` : data.context.eventName
  const head = `Result card of ${data.context.clubName}: “${input.headline}”, ${where}.`
  const tail = input.caption ? ` ${input.caption}.` : ''
  let body: string
  switch (data.kind) {
    case 'match': {
      const score = data.status === 'forfeit' ? '' : `, ${data.score.a} to ${data.score.b}`
      body = `${data.stage}: ${matchOutcome(data)}${score}. ${fighterWithClub(data.a)} against ${fighterWithClub(data.b)}.${stripLine(data)}`
      break
    }
    case 'fighter': {
      const pool = data.pool ? ` ${ordinal(data.pool.rank)} of ${data.pool.size} in pool ${data.pool.number}${data.pool.complete ? '' : ' so far'};` : ''
      const record = `${plural(data.record.wins, 'win')}, ${plural(data.record.losses, 'loss', 'losses')}${data.record.draws ? `, ${plural(data.record.draws, 'draw')}` : ''}`
      body = `${fighterWithClub(data.fighter)}:${pool} ${ordinal(data.overall.rank)} of ${data.overall.of} overall. ${record}; unharmed in ${data.unharmed} of ${plural(data.bouts, 'bout')}, a survival rate of ${wholePercent(data.survivalRate)}. ${QUALIFICATION_LINES[data.qualification]}.`
      break
    }
    case 'pool': {
      const rows = data.rows.map(r => `${r.out ? 'out' : ordinal(r.rank)} ${r.name} (${r.clubName}), ${r.wins} wins, ${r.losses} losses, survival rate ${wholePercent(r.survivalRate)}`)
      body = `Pool ${data.number}${data.complete ? '' : ', still being fenced'}: ${rows.join('; ')}.`
      break
    }
    case 'podium':
      body = data.places.length === 0
        ? 'The finalists are not known yet.'
        : `${data.complete ? 'Final places' : 'The final four'}: ${placeLine(data.places, data.complete)}.`
      break
    case 'summary':
      body = `${plural(data.fighters, 'fighter')} from ${plural(data.clubs, 'club')}, ${plural(data.matches, 'match', 'matches')} and ${plural(data.bouts, 'bout')} fenced, ${plural(data.doubles, 'double')} (a doubles rate of ${wholePercent(data.doublesRate)}).${data.winner ? ` Winner: ${fighterWithClub(data.winner)}.` : ''}`
      break
  }
  return `${head} ${body}${tail}`.replace(/\s+/g, ' ').trim()
}

/** A file name part from a name: lower case, ASCII letters and digits, single hyphens. */
export function fileSlug(name: string): string {
  return name.normalize('NFKD').replace(/[\u0300-\u036F]/g, '').toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'card'
}
