// A ZIP reader for the tests, written from the format's specification rather than taken from
// the library that writes the app's ZIPs: PKWARE "APPNOTE.TXT - .ZIP File Format Specification",
// 4.3.16 end of central directory record, 4.3.12 central directory header, 4.3.7 local file
// header. It reads stored and deflated entries and checks each one's CRC-32.
import { crc32, inflateRawSync } from 'node:zlib'

export function readZip(zip: Buffer): Map<string, Buffer> {
  // The end record is the last 22 bytes when there is no archive comment.
  let end = zip.length - 22
  while (end >= 0 && zip.readUInt32LE(end) !== 0x06054B50) end -= 1
  if (end < 0) throw new Error('no end of central directory record')
  const count = zip.readUInt16LE(end + 10)
  let at = zip.readUInt32LE(end + 16)
  const files = new Map<string, Buffer>()
  for (let i = 0; i < count; i++) {
    if (zip.readUInt32LE(at) !== 0x02014B50) throw new Error(`central directory entry ${i} has a bad signature`)
    const method = zip.readUInt16LE(at + 10)
    const crc = zip.readUInt32LE(at + 16)
    const compressed = zip.readUInt32LE(at + 20)
    const size = zip.readUInt32LE(at + 24)
    const nameLength = zip.readUInt16LE(at + 28)
    const extra = zip.readUInt16LE(at + 30)
    const comment = zip.readUInt16LE(at + 32)
    const local = zip.readUInt32LE(at + 42)
    const name = zip.subarray(at + 46, at + 46 + nameLength).toString('utf8')
    if (zip.readUInt32LE(local) !== 0x04034B50) throw new Error(`${name}: bad local header`)
    const start = local + 30 + zip.readUInt16LE(local + 26) + zip.readUInt16LE(local + 28)
    const raw = zip.subarray(start, start + compressed)
    const data = method === 0 ? Buffer.from(raw) : method === 8 ? inflateRawSync(raw) : null
    if (!data) throw new Error(`${name}: compression method ${method} is not read here`)
    if (data.length !== size) throw new Error(`${name}: ${data.length} bytes, the directory says ${size}`)
    if (crc32(data) !== crc) throw new Error(`${name}: CRC-32 does not match`)
    files.set(name, data)
    at += 46 + nameLength + extra + comment
  }
  return files
}
