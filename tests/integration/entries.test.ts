import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client } from '../support/http'
import type { TestClub } from '../support/fixtures'
import { makeClub, PASSWORD, pool, tableCounts } from '../support/fixtures'

let club: TestClub
let other: TestClub
let organizer: Client
let ruleSetId: number
let eventCount = 0
const as = (c: TestClub, role: keyof TestClub['members']) => new Client().signIn(c.members[role].email, PASSWORD)
const fightersPath = () => `/api/clubs/${club.id}/fighters`
const CHECKS = { kitChecked: true, weaponChecked: true }

/** A fresh event with one tournament; answers the tournament's path. */
async function makeTournament() {
  eventCount += 1
  const event = await organizer.post(`/api/clubs/${club.id}/events`, {
    name: 'Wrenmouth Harvest Open', slug: `entries-open-${eventCount}`, startsOn: '2026-09-12', endsOn: '2026-09-12',
  })
  const tournament = await organizer.post(`/api/clubs/${club.id}/events/${event.data.id}/tournaments`, {
    name: 'Sword and buckler', weapon: 'sword and buckler', ruleSetId,
  })
  expect(tournament.status).toBe(201)
  return `/api/clubs/${club.id}/events/${event.data.id}/tournaments/${tournament.data.id}`
}

async function fighter(name: string, clubName = 'Ironquay Fencing Hall') {
  const res = await organizer.post(fightersPath(), { name, clubName })
  if (res.status === 201) return res.data.id as number
  const found = await organizer.get(`${fightersPath()}?q=${encodeURIComponent(name)}`)
  return found.data.fighters.find((f: { clubName: string }) => f.clubName === clubName).id as number
}

async function enter(tournament: string, name: string, seed: number | null = null) {
  const res = await organizer.post(`${tournament}/entries`, { fighterId: await fighter(name), seed })
  expect(res.status).toBe(201)
  return res.data as { id: number }
}

function importCsv(client: Client, tournament: string, csv: string, dryRun: boolean) {
  return client.post(`${tournament}/entries/import`, { csv, dryRun })
}

beforeAll(async () => {
  club = await makeClub('entries')
  other = await makeClub('entries-other')
  organizer = await as(club, 'organizer')
  const rules = await organizer.post(`/api/clubs/${club.id}/rule-sets`, { name: 'Entries rules', preset: 'first-hit-three-bouts' })
  ruleSetId = rules.data.id
})
afterAll(() => pool.end())

describe('entries', () => {
  it('enters roster fighters with optional seeds and lists seeded ones first', async () => {
    const t = await makeTournament()
    await enter(t, 'Ysolde Markham')
    await enter(t, 'Corin Fallowby', 2)
    await enter(t, 'Edda Thrane', 1)
    const res = await (await as(club, 'scorekeeper')).get(`${t}/entries`)
    expect(res.status).toBe(200)
    expect(res.data.entries.map((e: { fighter: { name: string }, seed: number | null }) => [e.fighter.name, e.seed]))
      .toEqual([['Edda Thrane', 1], ['Corin Fallowby', 2], ['Ysolde Markham', null]])
    expect(res.data.entries[0].status).toBe('entered')
  })

  it('refuses the same fighter twice, a taken seed and a fighter from another roster', async () => {
    const t = await makeTournament()
    const first = await enter(t, 'Mara Quillon', 1)
    expect(first.id).toBeGreaterThan(0)
    const twice = await organizer.post(`${t}/entries`, { fighterId: await fighter('Mara Quillon') })
    expect(twice.status).toBe(409)
    expect(twice.data.data.fields.fighterId).toMatch(/already entered/)
    const seed = await organizer.post(`${t}/entries`, { fighterId: await fighter('Tobin Ashgrove'), seed: 1 })
    expect(seed.status).toBe(409)
    expect(seed.data.data.fields.seed).toBe('Seed 1 is already given to Mara Quillon')
    const theirs = await (await as(other, 'organizer')).post(`/api/clubs/${other.id}/fighters`, { name: 'Outside Fighter', clubName: 'Greyfield Sword Society' })
    const foreign = await organizer.post(`${t}/entries`, { fighterId: theirs.data.id })
    expect(foreign.status).toBe(400)
    expect(foreign.data.data.fields.fighterId).toMatch(/roster/)
    const badSeed = await organizer.post(`${t}/entries`, { fighterId: await fighter('Tobin Ashgrove'), seed: 0 })
    expect(badSeed.status).toBe(400)
    expect(badSeed.data.data.fields.seed).toBe('Must be a whole number ≥ 1')
  })

  it('changes and clears a seed, and removes an entry while entries are open', async () => {
    const t = await makeTournament()
    const entry = await enter(t, 'Hale Brannock', 4)
    const moved = await organizer.patch(`${t}/entries/${entry.id}`, { seed: 3 })
    expect(moved.data.seed).toBe(3)
    expect((await organizer.patch(`${t}/entries/${entry.id}`, { seed: null })).data.seed).toBeNull()
    expect((await organizer.delete(`${t}/entries/${entry.id}`)).status).toBe(204)
    expect((await organizer.get(`${t}/entries`)).data.entries).toEqual([])
    expect((await organizer.delete(`${t}/entries/${entry.id}`)).status).toBe(404)
  })

  it('leaves every entry change to the organizer: 403 for others, 404 for another club, 401 anonymous', async () => {
    const t = await makeTournament()
    const entry = await enter(t, 'Orla Penhallow')
    const piet = await fighter('Piet Varrow')
    const before = await tableCounts()
    for (const role of ['admin', 'scorekeeper', 'streamer', 'commentator', 'editor'] as const) {
      const member = await as(club, role)
      const attempts = [
        await member.post(`${t}/entries`, { fighterId: piet }),
        await member.patch(`${t}/entries/${entry.id}`, { seed: 1 }),
        await member.post(`${t}/entries/${entry.id}/check-in`, CHECKS),
        await member.post(`${t}/entries/${entry.id}/withdraw`, { reason: 'injury' }),
        await member.delete(`${t}/entries/${entry.id}`),
        await importCsv(member, t, 'name,club\nSela Dunmore,Ironquay Fencing Hall\n', false),
      ]
      expect(attempts.map(r => r.status), role).toEqual([403, 403, 403, 403, 403, 403])
    }
    const outsider = await as(other, 'organizer')
    expect((await outsider.get(`${t}/entries`)).status).toBe(404)
    expect((await outsider.post(`${t}/entries/${entry.id}/check-in`, CHECKS)).status).toBe(404)
    expect((await importCsv(outsider, t, 'name,club\nSela Dunmore,Ironquay Fencing Hall\n', false)).status).toBe(404)
    expect((await new Client().get(`${t}/entries`)).status).toBe(401)
    expect(await tableCounts()).toEqual(before)
  })
})

describe('check-in', () => {
  it('refuses a check-in without the safety checklist, naming each unconfirmed check', async () => {
    const t = await makeTournament()
    const entry = await enter(t, 'Bryn Calloway')
    const none = await organizer.post(`${t}/entries/${entry.id}/check-in`, {})
    expect(none.status).toBe(400)
    expect(Object.keys(none.data.data.fields).sort()).toEqual(['kitChecked', 'weaponChecked'])
    const half = await organizer.post(`${t}/entries/${entry.id}/check-in`, { kitChecked: true, weaponChecked: false })
    expect(half.status).toBe(400)
    expect(Object.keys(half.data.data.fields)).toEqual(['weaponChecked'])
    expect(half.data.data.fields.weaponChecked).toMatch(/flex-checked/)
    const { rows } = await pool.query('select status, kit_checked, checked_in_at from entries where id = $1', [entry.id])
    expect(rows[0]).toEqual({ status: 'entered', kit_checked: false, checked_in_at: null })
  })

  it('checks in with both checks confirmed, keeps the first time on a retry, and undoes it', async () => {
    const t = await makeTournament()
    const entry = await enter(t, 'Nell Saltire')
    const done = await organizer.post(`${t}/entries/${entry.id}/check-in`, CHECKS)
    expect(done.status).toBe(200)
    expect(done.data).toMatchObject({ status: 'checked-in', kitChecked: true, weaponChecked: true })
    expect(done.data.checkedInAt).toBeTruthy()
    const retry = await organizer.post(`${t}/entries/${entry.id}/check-in`, CHECKS)
    expect(retry.data.checkedInAt).toBe(done.data.checkedInAt)
    const undone = await organizer.delete(`${t}/entries/${entry.id}/check-in`)
    expect(undone.status).toBe(200)
    expect(undone.data).toMatchObject({ status: 'entered', kitChecked: false, weaponChecked: false, checkedInAt: null })
  })

  it('the database itself refuses a checked-in entry without both checks', async () => {
    const t = await makeTournament()
    const entry = await enter(t, 'Alder Crane')
    await expect(pool.query(`update entries set status = 'checked-in', checked_in_at = now(), kit_checked = true where id = $1`, [entry.id]))
      .rejects.toThrow(/entries_checked_in_safely/)
  })
})

describe('withdrawal', () => {
  it('withdraws with a reason, and then refuses check-in or a second withdrawal', async () => {
    const t = await makeTournament()
    const entry = await enter(t, 'Wynn Harrowgate')
    const noReason = await organizer.post(`${t}/entries/${entry.id}/withdraw`, {})
    expect(noReason.status).toBe(400)
    expect(noReason.data.data.fields).toHaveProperty('reason')
    const res = await organizer.post(`${t}/entries/${entry.id}/withdraw`, { reason: 'Suspected concussion in the warm-up' })
    expect(res.status).toBe(200)
    expect(res.data).toMatchObject({ status: 'withdrawn', withdrawalReason: 'Suspected concussion in the warm-up' })
    expect(res.data.withdrawnAt).toBeTruthy()
    expect((await organizer.post(`${t}/entries/${entry.id}/check-in`, CHECKS)).status).toBe(409)
    expect((await organizer.post(`${t}/entries/${entry.id}/withdraw`, { reason: 'again' })).status).toBe(409)
  })

  it('allows withdrawal during the pools and finals but freezes the entry list; not once done', async () => {
    const t = await makeTournament()
    const a = await enter(t, 'Ansel Rook')
    const b = await enter(t, 'Leontyne Marsh')
    const c = await enter(t, 'Garrick Penwyth')
    for (const e of [a, b, c]) await organizer.post(`${t}/entries/${e.id}/check-in`, CHECKS)
    expect((await organizer.post(`${t}/phase`, { to: 'pools' })).status).toBe(200)

    expect((await organizer.post(`${t}/entries`, { fighterId: await fighter('Late Arrival') })).status).toBe(409)
    expect((await organizer.delete(`${t}/entries/${a.id}`)).status).toBe(409)
    expect((await organizer.patch(`${t}/entries/${a.id}`, { seed: 1 })).status).toBe(409)
    expect((await organizer.delete(`${t}/entries/${a.id}/check-in`)).status).toBe(409)
    const late = await importCsv(organizer, t, 'name,club\nLate Arrival,Ironquay Fencing Hall\n', true)
    expect(late.status).toBe(409)

    const out = await organizer.post(`${t}/entries/${a.id}/withdraw`, { reason: 'Broken glove, no spare' })
    expect(out.status).toBe(200)
    const counts = (await organizer.get(t)).data.entries
    expect(counts).toEqual({ entered: 0, checkedIn: 2, withdrawn: 1 })

    await organizer.post(`${t}/phase`, { to: 'finals' })
    expect((await organizer.post(`${t}/entries/${b.id}/withdraw`, { reason: 'Knee injury' })).status).toBe(200)
    await organizer.post(`${t}/phase`, { to: 'done' })
    const after = await organizer.post(`${t}/entries/${c.id}/withdraw`, { reason: 'Too late' })
    expect(after.status).toBe(409)
    expect(after.data.message).toMatch(/finished/)
  })
})

describe('CSV import', () => {
  const threeFighters = [
    'name,club,email,seed',
    'Oswin Tarrant,Ironquay Fencing Hall,oswin@ironquay.example,1',
    'Bettany Crewe,North Downs Buckler Circle,,2',
    'Idris Fennick,Lanterngate Historical Fencing,,',
  ].join('\n')

  it('previews every row and writes nothing', async () => {
    const t = await makeTournament()
    const before = await tableCounts()
    const res = await importCsv(organizer, t, threeFighters, true)
    expect(res.status).toBe(200)
    expect(res.data).toMatchObject({ dryRun: true, delimiter: ',', columns: ['name', 'club', 'email', 'seed'], imported: null })
    expect(res.data.rows.map((r: { line: number, status: string }) => [r.line, r.status])).toEqual([[2, 'ok'], [3, 'ok'], [4, 'ok']])
    expect(res.data.rows[0].values).toEqual({ name: 'Oswin Tarrant', club: 'Ironquay Fencing Hall', email: 'oswin@ironquay.example', seed: 1 })
    expect(res.data.summary).toEqual({ rows: 3, ok: 3, errors: 0, newFighters: 3, existingFighters: 0 })
    expect(await tableCounts()).toEqual(before)
  })

  it('imports every row in one go: new fighters into the roster and their entries', async () => {
    const t = await makeTournament()
    const before = await tableCounts()
    const res = await importCsv(organizer, t, threeFighters, false)
    expect(res.status).toBe(201)
    expect(res.data.imported).toEqual({ fighters: 3, entries: 3 })
    const after = await tableCounts()
    expect(after.fighters).toBe(before.fighters! + 3)
    expect(after.entries).toBe(before.entries! + 3)
    const entries = (await organizer.get(`${t}/entries`)).data.entries
    expect(entries.map((e: { fighter: { name: string }, seed: number | null }) => [e.fighter.name, e.seed]))
      .toEqual([['Oswin Tarrant', 1], ['Bettany Crewe', 2], ['Idris Fennick', null]])
    // The same file into a second tournament finds the fighters in the roster.
    const again = await importCsv(organizer, await makeTournament(), threeFighters, true)
    expect(again.data.rows.map((r: { fighter: string }) => r.fighter)).toEqual(['existing', 'existing', 'existing'])
  })

  it('refuses the whole file when one row is bad (400 with the row report) and writes nothing', async () => {
    const t = await makeTournament()
    const csv = 'name,club,seed\nSela Dunmore,Ironquay Fencing Hall,1\nPiet Varrow,Old Mill Fencing School,2\nHollis Vane,Greyfield Sword Society,first\n'
    const before = await tableCounts()
    const res = await importCsv(organizer, t, csv, false)
    expect(res.status).toBe(400)
    expect(res.data.message).toContain('line 4, seed: must be a whole number ≥ 1')
    expect(res.data.data.fields.csv).toMatch(/1 row has an error/)
    const rows = res.data.data.rows
    expect(rows.map((r: { status: string }) => r.status)).toEqual(['ok', 'ok', 'error'])
    expect(rows[2].errors).toEqual([{ column: 'seed', message: 'must be a whole number ≥ 1', text: 'line 4, seed: must be a whole number ≥ 1' }])
    expect(rows[2].raw.seed).toBe('first')
    expect(await tableCounts()).toEqual(before)
    expect((await organizer.get(`${t}/entries`)).data.entries).toEqual([])
  })

  it('reads a spreadsheet export: byte-order mark, CRLF, semicolons, quotes and blank lines', async () => {
    const t = await makeTournament()
    const csv = '\uFEFFNAME ; Club ; Email ; Seed\r\n'
      + '"Quillon; Mara";"Ironquay ""Old Hall"" Fencing";;3\r\n'
      + '\r\n'
      + ';;;\r\n'
      + '"Ansel\r\nRook";Old Mill Fencing School;ANSEL@OLDMILL.EXAMPLE;\r\n'
      + 'Corin Fallowby;Greyfield Sword Society;;\r\n'
    const res = await importCsv(organizer, t, csv, true)
    expect(res.status).toBe(200)
    expect(res.data.delimiter).toBe(';')
    expect(res.data.rows.map((r: { line: number }) => r.line)).toEqual([2, 5, 7])
    expect(res.data.rows.map((r: { values: unknown }) => r.values)).toEqual([
      { name: 'Quillon; Mara', club: 'Ironquay "Old Hall" Fencing', email: null, seed: 3 },
      { name: 'Ansel Rook', club: 'Old Mill Fencing School', email: 'ansel@oldmill.example', seed: null },
      { name: 'Corin Fallowby', club: 'Greyfield Sword Society', email: null, seed: null },
    ])
    expect(res.data.summary.errors).toBe(0)
    const tabs = await importCsv(organizer, t, 'name\tclub\nEdda Thrane\tLanterngate Historical Fencing\n', true)
    expect(tabs.data.delimiter).toBe('tab')
    expect(tabs.data.rows[0].values.club).toBe('Lanterngate Historical Fencing')
    // Excel's optional first line naming the delimiter.
    const hinted = await importCsv(organizer, t, 'sep=;\r\nname;club\r\nEdda Thrane;Lanterngate, Historical Fencing\r\n', true)
    expect(hinted.data.delimiter).toBe(';')
    expect(hinted.data.rows.map((r: { line: number, values: { club: string } }) => [r.line, r.values.club])).toEqual([[3, 'Lanterngate, Historical Fencing']])
  })

  it('finds duplicates in the file and against the roster and the entries, ignoring case and spacing', async () => {
    const t = await makeTournament()
    await fighter('Isolde Brackwater', 'Greyfield Sword Society')
    await enter(t, 'Perrin Ashdown', 1)
    const csv = [
      'name,club,seed',
      'isolde  brackwater,GREYFIELD sword society,2',
      'Wynn Harrowgate,Old Mill Fencing School,3',
      ' WYNN HARROWGATE , old mill  fencing school,',
      'Perrin Ashdown,Ironquay Fencing Hall,',
      'Nell Saltire,Ironquay Fencing Hall,3',
      'Bryn Calloway,Ironquay Fencing Hall,1',
    ].join('\r\n')
    const before = await tableCounts()
    const preview = await importCsv(organizer, t, csv, true)
    expect(preview.status).toBe(200)
    const rows = preview.data.rows
    expect(rows[0]).toMatchObject({ line: 2, status: 'ok', fighter: 'existing' })
    expect(rows[0].fighterId).toBe(await fighter('Isolde Brackwater', 'Greyfield Sword Society'))
    expect(rows[1]).toMatchObject({ line: 3, status: 'ok', fighter: 'new' })
    expect(rows.slice(2).map((r: { errors: { text: string }[] }) => r.errors.map(e => e.text))).toEqual([
      ['line 4, name: the same fighter as line 3 (same name and club)'],
      ['line 5, name: is already entered in this tournament'],
      ['line 6, seed: seed 3 is also given on line 3'],
      ['line 7, seed: seed 1 is already given to Perrin Ashdown'],
    ])
    expect(preview.data.summary).toEqual({ rows: 6, ok: 2, errors: 4, newFighters: 1, existingFighters: 1 })
    const write = await importCsv(organizer, t, csv, false)
    expect(write.status).toBe(400)
    expect(write.data.data.summary.errors).toBe(4)
    expect(await tableCounts()).toEqual(before)
  })

  it('adds a missing e-mail to a roster fighter, and keeps a different one', async () => {
    const t = await makeTournament()
    const quenby = await fighter('Quenby Hale', 'Saltmarsh Sword Guild')
    const res = await importCsv(organizer, t, 'name,club,email\nQuenby Hale,Saltmarsh Sword Guild,quenby@saltmarsh.example\n', false)
    expect(res.status).toBe(201)
    expect(res.data.rows[0].notes).toEqual(['The e-mail will be added to the roster'])
    expect((await organizer.get(`${fightersPath()}/${quenby}`)).data.email).toBe('quenby@saltmarsh.example')
    const other = await importCsv(organizer, await makeTournament(), 'name,club,email\nQuenby Hale,Saltmarsh Sword Guild,q.hale@elsewhere.example\n', false)
    expect(other.data.rows[0].notes[0]).toMatch(/roster keeps it/)
    expect((await organizer.get(`${fightersPath()}/${quenby}`)).data.email).toBe('quenby@saltmarsh.example')
  })

  it('names the cells of an incomplete row', async () => {
    const t = await makeTournament()
    const res = await importCsv(organizer, t, 'club,name,email\nIronquay Fencing Hall,,nobody-at-example\n,Tamsin Oakridge,\n', true)
    expect(res.data.rows[0].errors.map((e: { text: string }) => e.text)).toEqual([
      'line 2, name: is empty; every row needs the fighter\'s name',
      'line 2, email: is not a valid e-mail address',
    ])
    expect(res.data.rows[1].errors.map((e: { column: string }) => e.column)).toEqual(['club'])
  })

  it('refuses a file without a name column, an empty file, a broken quote and a file over 1 MB', async () => {
    const t = await makeTournament()
    const noName = await importCsv(organizer, t, 'fighter,club\nMara Quillon,Ironquay Fencing Hall\n', true)
    expect(noName.status).toBe(400)
    expect(noName.data.data.fields.csv).toMatch(/^The file has no "name" column/)
    const empty = await importCsv(organizer, t, '\uFEFF\r\n\r\n', true)
    expect(empty.data.data.fields.csv).toBe('The file is empty')
    const headerOnly = await importCsv(organizer, t, 'name,club\r\n', true)
    expect(headerOnly.data.data.fields.csv).toMatch(/no fighters/)
    const quote = await importCsv(organizer, t, 'name,club\nMara Quillon,Ironquay Fencing Hall\n"Tobin Ashgrove,North Downs\n', true)
    expect(quote.status).toBe(400)
    expect(quote.data.data.fields.csv).toMatch(/^line 3: a quoted field is never closed/)
    const big = 'name,club\n' + 'Mara Quillon,Ironquay Fencing Hall\n'.repeat(31000)
    const tooBig = await importCsv(organizer, t, big, true)
    expect(tooBig.status).toBe(400)
    expect(tooBig.data.data.fields.csv).toMatch(/larger than 1 MB/)
    const notBoolean = await organizer.post(`${t}/entries/import`, { csv: 'name,club\n' })
    expect(notBoolean.status).toBe(400)
    expect(notBoolean.data.data.fields).toHaveProperty('dryRun')
  })
})
