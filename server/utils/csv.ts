import { parse } from 'csv-parse/sync'

export type CsvDelimiter = ',' | ';' | '\t'

export interface CsvTable {
  delimiter: CsvDelimiter
  /** The header's cells, trimmed and lower-cased. */
  header: string[]
  /** Non-blank records after the header, each with the line of the file it starts on. */
  rows: { line: number, fields: string[] }[]
}

const DELIMITERS: readonly CsvDelimiter[] = [',', ';', '\t']
const CR = 0x0D
const LF = 0x0A

function csvError(text: string) {
  return fieldError(400, 'csv', text)
}

/**
 * The delimiter that occurs most often outside quotes in the first non-blank line; comma on a tie.
 * Spreadsheets set to a decimal comma save with semicolons, so both are common.
 */
export function detectDelimiter(text: string): CsvDelimiter {
  const first = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/).find(line => line.trim() !== '') ?? ''
  const counts = new Map<CsvDelimiter, number>(DELIMITERS.map(d => [d, 0]))
  let quoted = false
  for (const char of first) {
    if (char === '"') quoted = !quoted
    else if (!quoted && counts.has(char as CsvDelimiter)) counts.set(char as CsvDelimiter, counts.get(char as CsvDelimiter)! + 1)
  }
  let best: CsvDelimiter = ','
  for (const d of DELIMITERS) if (counts.get(d)! > counts.get(best)!) best = d
  return best
}

/** Counts lines in a buffer as it is walked forward; CRLF, LF and a lone CR each end one line. */
class LineCounter {
  offset = 0
  line = 1
  constructor(private readonly bytes: Uint8Array) {
    // A byte-order mark is not part of the first line's text.
    if (bytes[0] === 0xEF && bytes[1] === 0xBB && bytes[2] === 0xBF) this.offset = 3
  }

  private step() {
    const b = this.bytes[this.offset]
    if (b === CR) {
      this.line++
      if (this.bytes[this.offset + 1] === LF) this.offset++
    }
    else if (b === LF) {
      this.line++
    }
    this.offset++
  }

  advanceTo(offset: number) {
    while (this.offset < offset && this.offset < this.bytes.length) this.step()
  }

  /** Skips the empty lines before the next record and answers the line it starts on. */
  nextRecordLine(): number {
    while (this.offset < this.bytes.length && (this.bytes[this.offset] === CR || this.bytes[this.offset] === LF)) this.step()
    return this.line
  }
}

function syntaxError(err: unknown, bytes: Uint8Array): never {
  const e = err as { code?: string, bytes_records?: number, bytes?: number, message?: string }
  if (typeof e?.code !== 'string' || !e.code.startsWith('CSV_')) throw err
  const counter = new LineCounter(bytes)
  counter.advanceTo(e.bytes_records ?? e.bytes ?? 0)
  const line = counter.nextRecordLine()
  if (e.code === 'CSV_QUOTE_NOT_CLOSED') throw csvError(`line ${line}: a quoted field is never closed; check for a missing "`)
  throw csvError(`line ${line}: the file could not be read as CSV (${e.code})`)
}

/**
 * Reads CSV text whose first non-blank line names the columns. Handles a byte-order mark, CRLF,
 * LF or CR line ends, comma, semicolon or tab delimiters (detected, or given by Excel's "sep=" line),
 * quoted fields with doubled quotes and line breaks, stray quotes inside fields, and blank lines.
 */
export function readCsvTable(text: string): CsvTable {
  if (text.includes('\u0000')) throw csvError('This is not a text file')
  let delimiter = detectDelimiter(text)
  const sep = /^\uFEFF?sep=([,;\t])\s*(?:\r\n|\n|\r|$)/i.exec(text)
  if (sep) delimiter = sep[1] as CsvDelimiter
  const bytes = Buffer.from(text, 'utf8')
  let records: { record: string[], info: { bytes: number } }[]
  try {
    records = parse(bytes, {
      bom: true, delimiter, info: true, trim: true,
      skip_empty_lines: true, relax_quotes: true, relax_column_count: true,
    }) as unknown as typeof records
  }
  catch (err) {
    syntaxError(err, bytes)
  }
  const counter = new LineCounter(bytes)
  const lines: { line: number, fields: string[] }[] = []
  for (const { record, info } of records) {
    const line = counter.nextRecordLine()
    counter.advanceTo(info.bytes)
    if (record.every(field => field.trim() === '')) continue
    lines.push({ line, fields: record })
  }
  if (sep && lines[0]?.line === 1) lines.shift()
  const [header, ...rows] = lines
  if (!header) throw csvError('The file is empty')
  return { delimiter, header: header.fields.map(name => name.trim().toLowerCase()), rows }
}
