import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client } from '../support/http'
import type { TestClip } from '../support/clips'
import { CLIP_SECONDS, makeClip, testFootage } from '../support/clips'
import type { TestClub } from '../support/fixtures'
import { db, makeClub, PASSWORD, pool, schema, tableCounts } from '../support/fixtures'
import { cueText, parseVtt } from '../support/vtt'

let club: TestClub
let other: TestClub
let clip: TestClip
let commentator: Client
let editor: Client
const as = (c: TestClub, role: keyof TestClub['members']) => new Client().signIn(c.members[role].email, PASSWORD)
const kindsUrl = (c: TestClub = club) => `/api/clubs/${c.id}/mark-kinds`
const marksUrl = (clipId = clip.id, c: TestClub = club) => `/api/clubs/${c.id}/clips/${clipId}/marks`
const mediaUrl = (file: string, clipId = clip.id, c: TestClub = club) => `/media/clubs/${c.id}/clips/${clipId}/${file}`

async function kindId(client: Client, name: string, c: TestClub = club): Promise<number> {
  const res = await client.get(kindsUrl(c))
  const kind = res.data.kinds.find((k: { name: string }) => k.name === name)
  if (!kind) throw new Error(`no kind ${name}`)
  return kind.id
}

beforeAll(async () => {
  club = await makeClub('marks')
  other = await makeClub('marks-other')
  clip = await makeClip(club.id)
  commentator = await as(club, 'commentator')
  editor = await as(club, 'editor')
})
afterAll(() => pool.end())

describe('mark kinds', () => {
  it('gives a club with no kinds of its own the default list, in order', async () => {
    const res = await commentator.get(kindsUrl())
    expect(res.status).toBe(200)
    expect(res.data.kinds.map((k: { name: string }) => k.name)).toEqual(['hit', 'afterblow', 'double', 'parry', 'feint', 'footwork'])
    expect(res.data.kinds.every((k: { usedBy: number }) => k.usedBy === 0)).toBe(true)
    // Asked again (or twice at once), the defaults are not written a second time.
    await Promise.all([commentator.get(kindsUrl()), editor.get(kindsUrl())])
    const rows = await db.select().from(schema.markKinds).where(eq(schema.markKinds.clubId, club.id))
    expect(rows).toHaveLength(6)
  })

  it('lets commentators, editors and admins add, rename and reorder kinds', async () => {
    const added = await editor.post(kindsUrl(), { name: 'Disarm' })
    expect(added.status).toBe(201)
    expect(added.data.kinds.at(-1).name).toBe('Disarm')
    const id = await kindId(editor, 'Disarm')
    const renamed = await (await as(club, 'admin')).patch(`${kindsUrl()}/${id}`, { name: 'Bind and disarm' })
    expect(renamed.status).toBe(200)
    expect(renamed.data.kinds.at(-1)).toEqual({ id, name: 'Bind and disarm', usedBy: 0 })
    const ids: number[] = renamed.data.kinds.map((k: { id: number }) => k.id)
    const reordered = await commentator.request('PUT', `${kindsUrl()}/order`, { json: { ids: [id, ...ids.slice(0, -1)] } })
    expect(reordered.status).toBe(200)
    expect(reordered.data.kinds.map((k: { name: string }) => k.name)).toEqual(['Bind and disarm', 'hit', 'afterblow', 'double', 'parry', 'feint', 'footwork'])
    expect((await editor.get(kindsUrl())).data.kinds[0].name).toBe('Bind and disarm')
  })

  it('refuses a name the club already has, whatever its case, naming the field (409)', async () => {
    const res = await commentator.post(kindsUrl(), { name: '  PARRY ' })
    expect(res.status).toBe(409)
    expect(res.data.data.fields.name).toMatch(/already has a kind named “PARRY”/)
    const rename = await commentator.patch(`${kindsUrl()}/${await kindId(commentator, 'feint')}`, { name: 'Hit' })
    expect(rename.status).toBe(409)
    expect(rename.data.data.fields).toHaveProperty('name')
  })

  it('names the field for an empty or two-line name, an unknown field and an order that misses a kind', async () => {
    const empty = await commentator.post(kindsUrl(), { name: '   ' })
    expect(empty.status).toBe(400)
    expect(empty.data.data.fields.name).toBe('Enter a name')
    const lines = await commentator.post(kindsUrl(), { name: 'a\nb' })
    expect(lines.data.data.fields.name).toBe('Use one line')
    const extra = await commentator.post(kindsUrl(), { name: 'Cut', clubId: other.id })
    expect(extra.status).toBe(400)
    expect(extra.data.message).toMatch(/Unknown field: clubId/)
    const ids: number[] = (await commentator.get(kindsUrl())).data.kinds.map((k: { id: number }) => k.id)
    const missing = await commentator.request('PUT', `${kindsUrl()}/order`, { json: { ids: ids.slice(1) } })
    expect(missing.status).toBe(400)
    expect(missing.data.data.fields.ids).toMatch(/every one of the club’s kinds/)
    const twice = await commentator.request('PUT', `${kindsUrl()}/order`, { json: { ids: [ids[0], ...ids.slice(0, -1)] } })
    expect(twice.status).toBe(400)
    expect(twice.data.data.fields.ids).toBe('Name each kind once')
    const badId = await commentator.patch(`${kindsUrl()}/abc`, { name: 'x' })
    expect(badId.status).toBe(400)
    expect(badId.data.data.fields).toHaveProperty('kindId')
  })

  it('refuses to delete a kind that a mark uses, saying how many, and deletes it once unused', async () => {
    const parry = await kindId(commentator, 'parry')
    const mark = await commentator.post(marksUrl(), { atMs: 500, kindId: parry, label: 'High parry' })
    expect(mark.status).toBe(201)
    const before = await tableCounts()
    const refused = await editor.delete(`${kindsUrl()}/${parry}`)
    expect(refused.status).toBe(409)
    expect(refused.data.message).toBe('1 mark uses this kind, so it cannot be deleted. Give it another kind first, or rename this one.')
    expect(await tableCounts()).toEqual(before)
    expect((await editor.get(kindsUrl())).data.kinds.find((k: { id: number }) => k.id === parry).usedBy).toBe(1)
    expect((await commentator.delete(`${marksUrl()}/${mark.data.id}`)).status).toBe(200)
    const deleted = await editor.delete(`${kindsUrl()}/${parry}`)
    expect(deleted.status).toBe(200)
    expect(deleted.data.kinds.map((k: { name: string }) => k.name)).not.toContain('parry')
  })

  it('keeps at least one kind', async () => {
    const lonely = await makeClub('marks-lonely')
    const admin = await as(lonely, 'admin')
    const kinds: { id: number }[] = (await admin.get(kindsUrl(lonely))).data.kinds
    for (const kind of kinds.slice(1)) expect((await admin.delete(`${kindsUrl(lonely)}/${kind.id}`)).status).toBe(200)
    const last = await admin.delete(`${kindsUrl(lonely)}/${kinds[0]!.id}`)
    expect(last.status).toBe(409)
    expect(last.data.message).toMatch(/last kind/)
  })

  it('keeps kinds to the club: scorekeepers get 403, other clubs 404, and another club’s kind is not found', async () => {
    const scorekeeper = await as(club, 'scorekeeper')
    expect((await scorekeeper.get(kindsUrl())).status).toBe(403)
    expect((await scorekeeper.post(kindsUrl(), { name: 'Cut' })).status).toBe(403)
    const stranger = await as(other, 'commentator')
    expect((await stranger.get(kindsUrl())).status).toBe(404)
    const hit = await kindId(commentator, 'hit')
    expect((await stranger.patch(`${kindsUrl(other)}/${hit}`, { name: 'Stolen' })).status).toBe(404)
    expect((await stranger.delete(`${kindsUrl(other)}/${hit}`)).status).toBe(404)
    expect((await new Client().get(kindsUrl())).status).toBe(401)
  })
})

describe('marks on a clip', () => {
  it('adds, lists in time order, moves, edits and deletes marks', async () => {
    const hit = await kindId(commentator, 'hit')
    const afterblow = await kindId(commentator, 'afterblow')
    const first = await commentator.post(marksUrl(), { atMs: 3200, kindId: afterblow, label: 'Afterblow', comment: 'late, but counted' })
    expect(first.status).toBe(201)
    expect(first.data).toMatchObject({ atMs: 3200, kindId: afterblow, kind: 'afterblow', label: 'Afterblow', comment: 'late, but counted', entryId: null })
    const second = await editor.post(marksUrl(), { atMs: 1040, kindId: hit, label: ' Hit ', comment: ' to the forearm ' })
    expect(second.data).toMatchObject({ atMs: 1040, label: 'Hit', comment: 'to the forearm' })

    const list = await commentator.get(marksUrl())
    expect(list.status).toBe(200)
    expect(list.data.clip).toEqual({ id: clip.id, title: 'Pool A, match 3', status: 'ready', durationMs: CLIP_SECONDS * 1000, frameRate: 25, hasVideo: true, hasPoster: true, isPublic: false })
    expect(list.data.marks.map((m: { id: number }) => m.id)).toEqual([second.data.id, first.data.id])

    const moved = await commentator.patch(`${marksUrl()}/${first.data.id}`, { atMs: 600 })
    expect(moved.status).toBe(200)
    expect(moved.data).toMatchObject({ atMs: 600, label: 'Afterblow', comment: 'late, but counted' })
    const edited = await editor.patch(`${marksUrl()}/${first.data.id}`, { comment: 'both landed', kindId: null })
    expect(edited.data).toMatchObject({ atMs: 600, kindId: null, kind: null, comment: 'both landed' })
    expect((await commentator.get(marksUrl())).data.marks.map((m: { id: number }) => m.id)).toEqual([first.data.id, second.data.id])

    const deleted = await commentator.delete(`${marksUrl()}/${first.data.id}`)
    expect(deleted.status).toBe(200)
    expect(deleted.data).toMatchObject({ id: first.data.id, atMs: 600, comment: 'both landed' })
    expect((await commentator.delete(`${marksUrl()}/${first.data.id}`)).status).toBe(404)
    expect((await commentator.get(marksUrl())).data.marks).toHaveLength(1)
  })

  it('accepts a time at the very end of the clip and refuses one after it, naming atMs', async () => {
    expect((await commentator.post(marksUrl(), { atMs: CLIP_SECONDS * 1000, label: 'Halt' })).status).toBe(201)
    const before = await tableCounts()
    const late = await commentator.post(marksUrl(), { atMs: CLIP_SECONDS * 1000 + 1, label: 'Too late' })
    expect(late.status).toBe(400)
    expect(late.data.data.fields.atMs).toBe('The clip is 6.00 s long: give a time within it')
    const early = await commentator.post(marksUrl(), { atMs: -1, label: 'Too early' })
    expect(early.data.data.fields.atMs).toBe('The time cannot be before the clip starts')
    const fraction = await commentator.post(marksUrl(), { atMs: 10.5, label: 'Half' })
    expect(fraction.data.data.fields.atMs).toBe('Give the time in whole milliseconds')
    const text = await commentator.post(marksUrl(), { atMs: '1000', label: 'Text' })
    expect(text.data.data.fields.atMs).toBe('Give the time in milliseconds')
    expect(await tableCounts()).toEqual(before)
  })

  it('names the field for a missing or long label, a two-line or long comment, an unknown kind and an empty change', async () => {
    const otherKind = await (await as(other, 'commentator')).get(kindsUrl(other))
    const before = await tableCounts()
    const noLabel = await commentator.post(marksUrl(), { atMs: 100 })
    expect(noLabel.status).toBe(400)
    expect(noLabel.data.data.fields.label).toBe('Enter a label')
    const longLabel = await commentator.post(marksUrl(), { atMs: 100, label: 'x'.repeat(81) })
    expect(longLabel.data.data.fields.label).toBe('Use at most 80 characters')
    const twoLines = await commentator.post(marksUrl(), { atMs: 100, label: 'Hit', comment: 'one\ntwo' })
    expect(twoLines.data.data.fields.comment).toBe('Keep the comment to one line')
    const longComment = await commentator.post(marksUrl(), { atMs: 100, label: 'Hit', comment: 'y'.repeat(281) })
    expect(longComment.data.data.fields.comment).toBe('Use at most 280 characters')
    const foreign = await commentator.post(marksUrl(), { atMs: 100, label: 'Hit', kindId: otherKind.data.kinds[0].id })
    expect(foreign.status).toBe(400)
    expect(foreign.data.data.fields.kindId).toBe('Choose one of the club’s kinds')
    const mark = (await commentator.get(marksUrl())).data.marks[0]
    const nothing = await commentator.patch(`${marksUrl()}/${mark.id}`, {})
    expect(nothing.status).toBe(400)
    expect(nothing.data.message).toMatch(/at least one of atMs/)
    const late = await commentator.patch(`${marksUrl()}/${mark.id}`, { atMs: 999_999 })
    expect(late.data.data.fields).toHaveProperty('atMs')
    const notJson = await commentator.request('POST', marksUrl(), { body: 'atMs=1', headers: { 'content-type': 'application/x-www-form-urlencoded' } })
    expect(notJson.status).toBe(415)
    expect(await tableCounts()).toEqual(before)
  })

  it('puts a deleted mark back with its desk entry when undo sends it again', async () => {
    const entryId = '1b4e28ba-2fa1-4d2b-883f-0016d3cca427'
    const made = await commentator.post(marksUrl(), { atMs: 2000, label: 'Double', comment: 'both hit', entryId })
    expect(made.data.entryId).toBe(entryId)
    const gone = await commentator.delete(`${marksUrl()}/${made.data.id}`)
    const { id: _id, kind: _kind, ...again } = gone.data
    const back = await commentator.post(marksUrl(), again)
    expect(back.status).toBe(201)
    expect(back.data).toMatchObject({ atMs: 2000, label: 'Double', comment: 'both hit', entryId })
  })

  it('lets only the club’s commentators and editors mark: scorekeepers and admins 403, other clubs 404', async () => {
    const mark = (await commentator.get(marksUrl())).data.marks[0]
    for (const role of ['scorekeeper', 'admin', 'organizer', 'streamer'] as const) {
      const member = await as(club, role)
      expect((await member.get(marksUrl())).status).toBe(403)
      expect((await member.post(marksUrl(), { atMs: 1, label: 'x' })).status).toBe(403)
      expect((await member.patch(`${marksUrl()}/${mark.id}`, { label: 'x' })).status).toBe(403)
      expect((await member.delete(`${marksUrl()}/${mark.id}`)).status).toBe(403)
    }
    const stranger = await as(other, 'commentator')
    expect((await stranger.get(marksUrl())).status).toBe(404)
    // Through the stranger's own club, the clip is not theirs.
    expect((await stranger.get(marksUrl(clip.id, other))).status).toBe(404)
    expect((await stranger.patch(`${marksUrl(clip.id, other)}/${mark.id}`, { label: 'x' })).status).toBe(404)
    expect((await stranger.delete(`${marksUrl(clip.id, other)}/${mark.id}`)).status).toBe(404)
    expect((await stranger.get(mediaUrl('video', clip.id, other))).status).toBe(404)
    // A mark of one clip cannot be reached through another clip of the same club.
    const second = await makeClip(club.id)
    expect((await commentator.patch(`${marksUrl(second.id)}/${mark.id}`, { label: 'x' })).status).toBe(404)
    expect((await new Client().get(marksUrl())).status).toBe(401)
  })
})

describe('the clip’s files', () => {
  it('serves the video to commentators with byte ranges, so the player can seek', async () => {
    const { video } = await testFootage()
    const whole = await commentator.request('GET', mediaUrl('video'))
    expect(whole.status).toBe(200)
    expect(whole.headers.get('content-type')).toBe('video/mp4')
    expect(whole.headers.get('accept-ranges')).toBe('bytes')
    expect(Number(whole.headers.get('content-length'))).toBe(video.length)
    const res = await fetch(new URL(mediaUrl('video'), process.env.TEST_APP_URL ?? 'http://127.0.0.1:3100'), {
      headers: { range: 'bytes=100-199', cookie: [...commentator.cookies].map(([k, v]) => `${k}=${v}`).join('; ') },
    })
    expect(res.status).toBe(206)
    expect(res.headers.get('content-range')).toBe(`bytes 100-199/${video.length}`)
    expect(Buffer.from(await res.arrayBuffer())).toEqual(video.subarray(100, 200))
    const poster = await commentator.request('GET', mediaUrl('poster'))
    expect(poster.status).toBe(200)
    expect(poster.headers.get('content-type')).toBe('image/jpeg')
    expect((await (await as(club, 'scorekeeper')).get(mediaUrl('video'))).status).toBe(403)
    expect((await commentator.get(mediaUrl('secret.txt'))).status).toBe(400)
  })

  it('writes the marks as a valid WebVTT track with text/vtt, tricky labels included (W3C WebVTT)', async () => {
    const tricky = await makeClip(club.id, { title: 'Final --> <b>bold</b> & more' })
    const url = marksUrl(tricky.id)
    const long = 'Ωμέγα ⚔️ 剣術 ' + 'ñ'.repeat(60)
    const a = await commentator.post(url, { atMs: 0, label: 'Fish & <chips>', comment: 'a --> b <i>not italic</i>' })
    const b = await commentator.post(url, { atMs: 1500, label: long, comment: 'Zoë’s “zwerchhau” → 🛡️' })
    const c = await commentator.post(url, { atMs: 5000, label: 'Halt', comment: '' })
    const res = await commentator.request('GET', mediaUrl('marks.vtt', tricky.id))
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toBe('text/vtt; charset=utf-8')
    const tree = parseVtt(res.text)
    expect(tree.errors).toEqual([])
    expect(tree.cues.map(cue => [cue.id, cue.startTime, cue.endTime, cueText(cue)])).toEqual([
      [`mark-${a.data.id}`, 0, 1.5, 'Fish & <chips> — a --> b <i>not italic</i>'],
      [`mark-${b.data.id}`, 1.5, 5, `${long} — Zoë’s “zwerchhau” → 🛡️`],
      [`mark-${c.data.id}`, 5, 9, 'Halt'],
    ])
  })
})

describe('the public clip', () => {
  it('is 404 while its event is not published, and open to anyone once it is', async () => {
    const anonymous = new Client()
    expect((await anonymous.get(`/api/public/clips/${clip.id}`)).status).toBe(404)
    expect((await anonymous.get(`/media/public/clips/${clip.id}/video`)).status).toBe(404)
    expect((await anonymous.get(`/media/public/clips/${clip.id}/marks.vtt`)).status).toBe(404)
    expect((await anonymous.get(`/embed/clips/${clip.id}`)).status).toBe(404)

    const published = await makeClip(club.id, { published: true, frameRate: null })
    await commentator.post(marksUrl(published.id), { atMs: 1200, label: 'Hit', comment: 'clean' })
    const res = await anonymous.get(`/api/public/clips/${published.id}`)
    expect(res.status).toBe(200)
    expect(res.data.clip).toMatchObject({ id: published.id, durationMs: CLIP_SECONDS * 1000, frameRate: 25, hasPoster: true, isPublic: true })
    expect(res.data.marks).toEqual([expect.objectContaining({ atMs: 1200, label: 'Hit', comment: 'clean' })])
    expect(res.data.marks[0]).not.toHaveProperty('entryId')
    const video = await anonymous.request('GET', `/media/public/clips/${published.id}/video`, { headers: { range: 'bytes=0-9' } })
    expect(video.status).toBe(206)
    const vtt = await anonymous.get(`/media/public/clips/${published.id}/marks.vtt`)
    expect(parseVtt(vtt.text).errors).toEqual([])

    const page = await fetch(new URL(`/embed/clips/${published.id}`, process.env.TEST_APP_URL ?? 'http://127.0.0.1:3100'))
    expect(page.status).toBe(200)
    // CSP Level 3 frame-ancestors: the club site (this app) may frame the player.
    expect(page.headers.get('content-security-policy')).toBe('frame-ancestors \'self\'')

    await db.update(schema.events).set({ published: false }).where(eq(schema.events.id, published.eventId))
    expect((await anonymous.get(`/api/public/clips/${published.id}`)).status).toBe(404)
  })

  it('is 404 while the clip is still being cut', async () => {
    const cutting = await makeClip(club.id, { published: true })
    await db.update(schema.clips).set({ status: 'cutting' }).where(eq(schema.clips.id, cutting.id))
    expect((await new Client().get(`/api/public/clips/${cutting.id}`)).status).toBe(404)
    expect((await new Client().get(`/api/public/clips/abc`)).status).toBe(400)
  })
})
