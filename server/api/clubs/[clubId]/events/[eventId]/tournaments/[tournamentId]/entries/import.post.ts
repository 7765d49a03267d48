import { entryImportSchema, MAX_IMPORT_BYTES } from '#shared/schemas/tournament'

// The preview (dryRun) and the import run the same checks; the import writes every row in one
// transaction, or nothing at all when any row has an error.
export default defineEventHandler(async (event) => {
  const ids = validParams(event, tournamentParams)
  await requireClubRole(event, ids.clubId, ['organizer'])
  const tooLarge = () => fieldError(400, 'csv', 'The file is larger than 1 MB; split it into smaller files')
  // JSON escaping can grow the text, so the body may be somewhat larger than the file.
  if (Number(getRequestHeader(event, 'content-length') ?? 0) > 6 * MAX_IMPORT_BYTES) throw tooLarge()
  const { csv, dryRun } = await validBody(event, entryImportSchema)
  if (Buffer.byteLength(csv, 'utf8') > MAX_IMPORT_BYTES) throw tooLarge()
  const table = readCsvTable(csv)

  const result = await useDb().transaction(async (tx) => {
    const { tournament } = await findTournament(tx, ids, { lock: !dryRun })
    requirePhase(tournament, ['entries'], 'importing entries')
    const plan = await planEntryImport(tx, ids.clubId, tournament.id, table)
    if (dryRun || plan.summary.errors > 0) return { plan, imported: null }
    return { plan, imported: await applyEntryImport(tx, ids.clubId, tournament.id, plan) }
  }).catch((err: unknown) => {
    // Someone added the same fighter or seed while this ran: nothing was written.
    if (isUniqueViolation(err)) throw conflictError('The roster or the entries changed during the import, so nothing was imported. Preview the file again.')
    throw err
  })

  const { plan, imported } = result
  if (!dryRun && !imported) {
    const errors = plan.rows.flatMap(row => row.errors)
    const count = plan.summary.errors === 1 ? '1 row has an error' : `${plan.summary.errors} rows have errors`
    throw createError({
      statusCode: 400,
      statusMessage: 'Bad Request',
      message: `csv: ${count}, so nothing was imported (${errors[0]!.text}${errors.length > 1 ? '; …' : ''})`,
      data: { fields: { csv: `${count}, so nothing was imported` }, dryRun, ...plan },
    })
  }
  if (imported) setResponseStatus(event, 201)
  return { dryRun, ...plan, imported }
})
