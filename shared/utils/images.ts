// Image type from the first bytes of the file, never from its name or the declared type.
// Signatures: PNG (ISO/IEC 15948 §5.2), JPEG (ITU T.81 SOI marker), WebP (RIFF….WEBP, RFC 9649).
export type ImageType = 'image/png' | 'image/jpeg' | 'image/webp'

export function sniffImageType(bytes: Uint8Array): ImageType | null {
  const at = (i: number) => bytes[i] ?? -1
  if ([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A].every((b, i) => at(i) === b)) return 'image/png'
  if (at(0) === 0xFF && at(1) === 0xD8 && at(2) === 0xFF) return 'image/jpeg'
  const ascii = (from: number, to: number) => String.fromCharCode(...bytes.subarray(from, to))
  if (bytes.length >= 12 && ascii(0, 4) === 'RIFF' && ascii(8, 12) === 'WEBP') return 'image/webp'
  return null
}

export const IMAGE_EXTENSIONS: Record<ImageType, string> = { 'image/png': 'png', 'image/jpeg': 'jpg', 'image/webp': 'webp' }

/** Logos and fighter photos. */
export const MAX_IMAGE_BYTES = 2 * 1024 * 1024
