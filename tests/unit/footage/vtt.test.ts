// Checked with the W3C WebVTT validator's parser (webvtt-parser 2.2.0, strict), against
// W3C WebVTT: The Web Video Text Tracks Format, https://www.w3.org/TR/webvtt1/.
import { describe, expect, it } from 'vitest'
import { escapeVttText, formatVttTime, marksToVtt } from '#shared/footage/vtt'
import { MARK_HOLD_MS } from '#shared/footage/marks'
import { cueText, parseVtt as parse } from '../../support/vtt'

describe('WebVTT timestamps', () => {
  it('writes hh:mm:ss.ttt', () => {
    expect(formatVttTime(0)).toBe('00:00:00.000')
    expect(formatVttTime(1_500)).toBe('00:00:01.500')
    expect(formatVttTime(3_723_004)).toBe('01:02:03.004')
    expect(formatVttTime(100 * 3_600_000)).toBe('100:00:00.000')
  })
})

describe('WebVTT cue text', () => {
  it('escapes the characters WebVTT reads as markup and keeps one line', () => {
    expect(escapeVttText('Tom & <b>Jerry</b> -->')).toBe('Tom &amp; &lt;b&gt;Jerry&lt;/b&gt; --&gt;')
    expect(escapeVttText('one\ntwo\r\nthree')).toBe('one two three')
  })
})

describe('a clip’s marks as a WebVTT track', () => {
  it('is a valid track with one cue per mark, from the mark to the next', () => {
    const vtt = marksToVtt([
      { id: 12, atMs: 4_200, label: 'Afterblow', comment: 'late, but counted' },
      { id: 11, atMs: 1_000, label: 'Hit', comment: 'to the forearm' },
    ], { title: 'Pool A, match 3' })
    expect(vtt.startsWith('WEBVTT - Pool A, match 3\n\n')).toBe(true)
    const tree = parse(vtt)
    expect(tree.errors).toEqual([])
    expect(tree.cues.map(c => [c.id, c.startTime, c.endTime, c.text])).toEqual([
      ['mark-11', 1, 4.2, 'Hit — to the forearm'],
      ['mark-12', 4.2, 4.2 + MARK_HOLD_MS / 1000, 'Afterblow — late, but counted'],
    ])
  })

  it('is valid with no marks at all', () => {
    const tree = parse(marksToVtt([]))
    expect(tree.errors).toEqual([])
    expect(tree.cues).toEqual([])
  })

  it('stays valid with ampersands, angle brackets, an arrow in the comment and long Unicode, and reads back the same text', () => {
    const long = 'Ωμέγα ⚔️ 剣術 ' + 'ñ'.repeat(200)
    const marks = [
      { id: 1, atMs: 0, label: 'Fish & <chips>', comment: 'a --> b, then <v Fighter>x</v> &amp;' },
      { id: 2, atMs: 800, label: '-->', comment: '' },
      { id: 3, atMs: 800, label: long, comment: 'Zoë’s “zwerchhau” → 🛡️' },
      { id: 4, atMs: 2_000, label: 'WEBVTT', comment: 'NOTE this is not a note' },
    ]
    const tree = parse(marksToVtt(marks, { title: 'Title --> with arrow' }))
    expect(tree.errors).toEqual([])
    expect(tree.cues.map(c => c.text)).toEqual([
      'Fish &amp; &lt;chips&gt; — a --&gt; b, then &lt;v Fighter&gt;x&lt;/v&gt; &amp;amp;',
      '--&gt;',
      `${long} — Zoë’s “zwerchhau” → 🛡️`,
      'WEBVTT — NOTE this is not a note',
    ])
    // The parsed cue tree decodes the references back to the original characters, with no tags.
    expect(tree.cues.every(c => c.tree.children.every(n => n.type === 'text'))).toBe(true)
    expect(tree.cues.map(cueText)).toEqual([
      'Fish & <chips> — a --> b, then <v Fighter>x</v> &amp;',
      '-->',
      `${long} — Zoë’s “zwerchhau” → 🛡️`,
      'WEBVTT — NOTE this is not a note',
    ])
    expect(tree.cues.map(c => [c.startTime, c.endTime])).toEqual([[0, 0.8], [0.8, 2], [0.8, 2], [2, 2 + MARK_HOLD_MS / 1000]])
  })
})
