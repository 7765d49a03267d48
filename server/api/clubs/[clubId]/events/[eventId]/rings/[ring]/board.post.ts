import { and, eq } from 'drizzle-orm'
import { z } from 'zod'
import { BOARD_MODES, BOARDS } from '#shared/live/types'

const boardSchema = z.object({
  onAir: z.enum(BOARDS, { error: `onAir: choose ${BOARDS.join(', ')}` }).optional(),
  mode: z.enum(BOARD_MODES, { error: 'mode: choose auto or manual' }).optional(),
}).strict().refine(value => value.onAir !== undefined || value.mode !== undefined, { error: 'Send onAir, mode or both' })

// The streamer puts a board on air, or lets it follow the match. It reaches the overlays at once.
export default defineEventHandler(async (event) => {
  const ids = validParams(event, ringParams)
  await requireClubRole(event, ids.clubId, ['streamer', 'organizer'])
  const input = await validBody(event, boardSchema)
  return useDb().transaction(async (tx) => {
    const row = await findRing(tx, ids)
    const state = await ringState(tx, row.id, ids.ring, { lock: true })
    // Choosing a board by hand takes the ring out of automatic mode unless the mode is sent too.
    const board = { onAir: input.onAir ?? state.board, mode: input.mode ?? (input.onAir ? 'manual' as const : state.boardMode) }
    const r = schema.ringStates
    await tx.update(r).set({ board: board.onAir, boardMode: board.mode, updatedAt: new Date() })
      .where(and(eq(r.eventId, row.id), eq(r.ringNumber, ids.ring)))
    const seq = await publishLive(tx, row.id, ids.ring, { kind: 'board', ring: ids.ring, board, at: new Date().toISOString() }, { dirty: false })
    return { ring: ids.ring, seq, board }
  })
})
