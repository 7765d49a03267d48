import type { FinalsFormat, TournamentPhase } from '#shared/schemas/tournament'

// One tournament: its detail, its entries and the club's roster of fighters. Shapes follow the
// route files under server/api/clubs/[clubId]/events/[eventId]/tournaments and fighters.

export interface TournamentDetail extends EventTournament {
  event: { id: number, name: string, slug: string }
}

export type TournamentEntryStatus = 'entered' | 'checked-in' | 'withdrawn'

export interface TournamentEntry {
  id: number
  fighter: { id: number, name: string, clubName: string }
  seed: number | null
  status: TournamentEntryStatus
  checkedInAt: string | null
  kitChecked: boolean
  weaponChecked: boolean
  withdrawnAt: string | null
  withdrawalReason: string | null
  createdAt: string
  updatedAt: string
}

export interface RosterFighter {
  id: number
  name: string
  clubName: string
  email: string | null
  photoUrl: string | null
  createdAt: string
  updatedAt: string
}

export type ImportColumn = 'name' | 'club' | 'email' | 'seed'

export interface ImportRow {
  line: number
  raw: Record<ImportColumn, string>
  values: { name: string | null, club: string | null, email: string | null, seed: number | null }
  status: 'ok' | 'error'
  fighter: 'new' | 'existing' | null
  fighterId: number | null
  errors: { column: ImportColumn | 'fields', message: string, text: string }[]
  notes: string[]
}

export interface ImportPlan {
  dryRun: boolean
  delimiter: string
  columns: ImportColumn[]
  ignoredColumns: string[]
  rows: ImportRow[]
  summary: { rows: number, ok: number, errors: number, newFighters: number, existingFighters: number }
  imported: { fighters: number, entries: number } | null
}

export const PHASE_NAMES: Record<TournamentPhase, string> = {
  entries: 'Entries',
  pools: 'Pools',
  finals: 'Finals',
  done: 'Done',
}

/** What the phase means, in a line for the phase bar. */
export const PHASE_DUTIES: Record<TournamentPhase, string> = {
  entries: 'Taking entries and checking fighters in.',
  pools: 'Drawing the pools and fencing them.',
  finals: 'Fencing the finals.',
  done: 'Finished: results are final.',
}

export const ENTRY_STATUS_NAMES: Record<TournamentEntryStatus, string> = {
  'entered': 'Entered',
  'checked-in': 'Checked in',
  'withdrawn': 'Withdrawn',
}

/** "4 to a bracket with a match for third", "5 to a round-robin final". */
export function finalsLine(t: { qualifyCount: number, finalsFormat: FinalsFormat, bronzeMatch: boolean }): string {
  if (t.finalsFormat === 'round-robin') return `${t.qualifyCount} to a round-robin final`
  return `${t.qualifyCount} to a bracket${t.bronzeMatch && t.qualifyCount >= 4 ? ' with a match for third' : ''}`
}

export function tournamentBase(clubId: number, eventId: number, tournamentId: number): string {
  return `/api/clubs/${clubId}/events/${eventId}/tournaments/${tournamentId}`
}

export function useTournament(clubId: MaybeRefOrGetter<number>, eventId: MaybeRefOrGetter<number>, tournamentId: MaybeRefOrGetter<number>) {
  return useFetch<TournamentDetail>(() => tournamentBase(toValue(clubId), toValue(eventId), toValue(tournamentId)), {
    key: () => `tournament-${toValue(clubId)}-${toValue(tournamentId)}`,
  })
}

export function useTournamentEntries(clubId: MaybeRefOrGetter<number>, eventId: MaybeRefOrGetter<number>, tournamentId: MaybeRefOrGetter<number>) {
  return useFetch<{ tournament: { id: number, name: string, phase: TournamentPhase }, entries: TournamentEntry[] }>(
    () => `${tournamentBase(toValue(clubId), toValue(eventId), toValue(tournamentId))}/entries`,
    { key: () => `tournament-entries-${toValue(clubId)}-${toValue(tournamentId)}` },
  )
}

// ——— sortable tables ———

export type SortDirection = 'ascending' | 'descending'
export type SortValue = string | number | null

/**
 * Rows sorted by a chosen column; choosing the same column again turns the direction. Empty
 * values go last either way, and ties keep the order the rows came in.
 */
export function useSortedRows<T, K extends string>(
  rows: MaybeRefOrGetter<readonly T[]>,
  columns: Record<K, (row: T) => SortValue>,
  initial: { key: NoInfer<K>, direction?: SortDirection },
) {
  const key = ref(initial.key) as Ref<K>
  const direction = ref<SortDirection>(initial.direction ?? 'ascending')

  const sorted = computed(() => {
    const read = columns[key.value]
    const sign = direction.value === 'ascending' ? 1 : -1
    return toValue(rows)
      .map((row, index) => ({ row, index, value: read(row) }))
      .sort((x, y) => {
        if (x.value === y.value) return x.index - y.index
        if (x.value === null || x.value === '') return 1
        if (y.value === null || y.value === '') return -1
        const order = typeof x.value === 'number' && typeof y.value === 'number'
          ? x.value - y.value
          : String(x.value).localeCompare(String(y.value), 'en', { sensitivity: 'base', numeric: true })
        return order === 0 ? x.index - y.index : order * sign
      })
      .map(item => item.row)
  })

  /** `first` is the direction a column starts in: descending where more is better. */
  function sortBy(next: K, first: SortDirection = 'ascending') {
    if (key.value === next) direction.value = direction.value === 'ascending' ? 'descending' : 'ascending'
    else {
      key.value = next
      direction.value = first
    }
  }

  function ariaSort(column: K): SortDirection | 'none' {
    return key.value === column ? direction.value : 'none'
  }

  return reactive({ key, direction, sorted, sortBy, ariaSort })
}

// ——— the tournament page and its tabs ———

export interface TournamentContext {
  tournament: Ref<TournamentDetail>
  /** The API base of the tournament, e.g. /api/clubs/1/events/2/tournaments/3. */
  api: ComputedRef<string>
  /** The page base of the tournament, e.g. /clubs/saltmarsh-sword-guild/events/2/tournaments/3. */
  page: ComputedRef<string>
  refresh: () => Promise<void>
  /** Replace the tournament with the one a route answered. */
  update: (next: TournamentDetail) => void
}

const TOURNAMENT_CONTEXT: InjectionKey<TournamentContext> = Symbol('tournament')

export function provideTournament(context: TournamentContext) {
  provide(TOURNAMENT_CONTEXT, context)
}

/** The tournament of the page around a tab, loaded by pages/…/tournaments/[tournamentId].vue. */
export function useTournamentContext(): TournamentContext {
  const context = inject(TOURNAMENT_CONTEXT)
  if (!context) throw createError({ status: 500, statusText: 'Tournament not loaded', message: 'This tab belongs inside a tournament page.', fatal: true })
  return context
}

export interface EntryNotice { tone: 'success' | 'info' | 'danger', text: string, undo?: () => Promise<void> }

/** The notice above an entries list, with an undo of the last change when it has one. */
export function useEntryNotice() {
  const notice = ref<EntryNotice | null>(null)
  const undoing = ref(false)
  async function undo(failure = 'That was not undone. Please try again.') {
    const action = notice.value?.undo
    if (!action) return
    undoing.value = true
    try {
      await action()
    }
    catch (err) {
      notice.value = { tone: 'danger', text: apiErrorMessage(err, failure) }
    }
    finally {
      undoing.value = false
    }
  }
  return { notice, undoing, undo }
}

/** Puts a changed entry into the loaded list, or appends a new one, without a reload. */
export function replaceEntry(data: Ref<{ entries: TournamentEntry[] } | null | undefined>, entry: TournamentEntry) {
  if (!data.value) return
  const known = data.value.entries.some(e => e.id === entry.id)
  data.value = {
    ...data.value,
    entries: known ? data.value.entries.map(e => e.id === entry.id ? entry : e) : [...data.value.entries, entry],
  }
}

/** A withdrawal can be taken back until the finals (…/entries/[entryId]/withdraw.delete.ts). */
export function canTakeBackWithdrawal(phase: TournamentPhase): boolean {
  return phase === 'entries' || phase === 'pools'
}

export function takeBackWithdrawal(api: string, entry: TournamentEntry): Promise<TournamentEntry> {
  return $fetch<TournamentEntry>(`${api}/entries/${entry.id}/withdraw`, { method: 'DELETE' })
}

/**
 * Withdrawals on an entries screen: the notice after one (with an undo while it can be taken
 * back), and the notice once a withdrawal is taken back. `apply` puts the changed entry in place.
 */
export function useWithdrawals(context: TournamentContext, notice: Ref<EntryNotice | null>, apply: (entry: TournamentEntry) => void) {
  function takenBack(entry: TournamentEntry) {
    apply(entry)
    notice.value = {
      tone: 'success',
      text: `${entry.fighter.name} is back in the tournament${entry.status === 'checked-in' ? ', checked in' : entry.status === 'entered' ? '; check them in again' : ''}.`,
    }
    void context.refresh()
  }

  function withdrawn(entry: TournamentEntry) {
    apply(entry)
    const text = `${entry.fighter.name} has withdrawn: ${entry.withdrawalReason}.`
    notice.value = canTakeBackWithdrawal(context.tournament.value.phase)
      ? { tone: 'info', text, undo: async () => takenBack(await takeBackWithdrawal(context.api.value, entry)) }
      : { tone: 'info', text: `${text} Their final matches still to fence are forfeited to their opponents.` }
    void context.refresh()
  }

  return { withdrawn, takenBack }
}
