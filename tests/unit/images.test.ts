import { describe, expect, it } from 'vitest'
import { sniffImageType } from '../../shared/utils/images'

const bytes = (...values: (number | string)[]) => Uint8Array.from(values.flatMap(v => typeof v === 'string' ? [...v].map(c => c.charCodeAt(0)) : [v]))

describe('image type from content', () => {
  it('recognises the PNG signature (ISO/IEC 15948, 5.2)', () => {
    expect(sniffImageType(bytes(0x89, 'PNG', 0x0D, 0x0A, 0x1A, 0x0A, 0, 0, 0, 13))).toBe('image/png')
  })

  it('recognises a JPEG start-of-image marker (ITU-T T.81, B.1.1.3)', () => {
    expect(sniffImageType(bytes(0xFF, 0xD8, 0xFF, 0xE0, 0, 16, 'JFIF'))).toBe('image/jpeg')
  })

  it('recognises a WebP RIFF container (RFC 9649, section 2.5)', () => {
    expect(sniffImageType(bytes('RIFF', 0x24, 0, 0, 0, 'WEBPVP8 '))).toBe('image/webp')
  })

  it('refuses text, SVG and truncated signatures whatever the file is called', () => {
    expect(sniffImageType(bytes('<svg xmlns="http://www.w3.org/2000/svg"/>'))).toBeNull()
    expect(sniffImageType(bytes(0x89, 'PN'))).toBeNull()
    expect(sniffImageType(bytes('RIFF', 0, 0, 0, 0, 'WAVE'))).toBeNull()
    expect(sniffImageType(new Uint8Array())).toBeNull()
  })
})
