import { eq } from 'drizzle-orm'
import { z } from 'zod'
import { deriveMatch } from '#shared/rules'

// The longest a clock can be set to or moved by: far beyond any match's time limit.
const MAX_CLOCK_MS = 60 * 60 * 1000

const clockSchema = z.discriminatedUnion('action', [
  z.object({ action: z.literal('start'), expectedVersion: z.number().int().min(0) }).strict(),
  z.object({ action: z.literal('stop'), expectedVersion: z.number().int().min(0) }).strict(),
  /** Moves the time run so far by `ms` (negative gives time back). */
  z.object({
    action: z.literal('adjust'),
    ms: z.number({ error: 'ms: give the milliseconds to add or take away' }).int({ error: 'ms: use whole milliseconds' })
      .min(-MAX_CLOCK_MS, { error: 'ms: at most an hour at a time' }).max(MAX_CLOCK_MS, { error: 'ms: at most an hour at a time' }),
    expectedVersion: z.number().int().min(0),
  }).strict(),
], { error: 'action: choose start, stop or adjust' })

// The match clock of the points format, kept by the server so that every desk and board reads the
// same time. Calling time is an entry of the log (time-up), recorded by the desk.
export default defineEventHandler(async (event) => {
  const ids = validParams(event, matchParams)
  await requireClubRole(event, ids.clubId, ['organizer', 'scorekeeper'])
  const input = await validBody(event, clockSchema)
  return useDb().transaction(async (tx) => {
    const locked = await lockMatch(tx, ids)
    const { tournament, match } = locked
    requireMatchPhase(tournament, match, 'running the clock')
    requireBothSides(match)
    const ruleSet = rulesOf(tournament)
    if (ruleSet.format !== 'points') throw fieldError(409, 'action', 'The first-hit format has no match clock')
    const log = (await matchLogs(tx, [match.id])).get(match.id)!
    const state = deriveMatch(ruleSet, payloads(log))
    const refs = locked.sides
    if (match.version !== input.expectedVersion) {
      throw createError({
        statusCode: 409,
        statusMessage: 'Conflict',
        message: `expectedVersion: the match is at version ${match.version}, not ${input.expectedVersion}; look at the clock again`,
        data: { fields: { expectedVersion: `The match is at version ${match.version}` }, match: matchSummary(match, refs, state), state },
      })
    }
    if (match.status === 'finished' || match.status === 'forfeit' || state.finished) throw conflictError('The match has ended; its clock is stopped')

    const now = new Date()
    const running = match.clockRunningSince
    const elapsed = match.clockElapsedMs + (running ? now.getTime() - running.getTime() : 0)
    let change: { clockElapsedMs: number, clockRunningSince: Date | null }
    if (input.action === 'start') {
      if (running) throw fieldError(409, 'action', 'The clock is already running')
      change = { clockElapsedMs: match.clockElapsedMs, clockRunningSince: now }
    }
    else if (input.action === 'stop') {
      if (!running) throw fieldError(409, 'action', 'The clock is already stopped')
      change = { clockElapsedMs: elapsed, clockRunningSince: null }
    }
    else {
      change = { clockElapsedMs: Math.min(MAX_CLOCK_MS, Math.max(0, elapsed + input.ms)), clockRunningSince: running ? now : null }
    }
    const [updated] = await tx.update(schema.matches).set({
      ...change,
      version: match.version + 1,
      status: match.status === 'scheduled' ? 'under-way' : match.status,
      startedAt: match.startedAt ?? now,
    }).where(eq(schema.matches.id, match.id)).returning()
    const { live } = await publishMatch(tx, locked, updated!, payloads(log), state)
    return { match: matchSummary(updated!, refs, state), clock: live.clock, serverTime: now.toISOString() }
  })
})
