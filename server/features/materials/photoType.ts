export type PhotoType = 'image/png' | 'image/jpeg' | 'image/webp'

export const acceptedPhotoTypes: readonly PhotoType[] = ['image/png', 'image/jpeg', 'image/webp']

const startsWith = (bytes: Uint8Array, signature: readonly number[], offset = 0) =>
  bytes.length >= offset + signature.length && signature.every((byte, index) => bytes[offset + index] === byte)

const ascii = (text: string) => [...text].map((character) => character.charCodeAt(0))

/**
 * The image type the bytes are, from their signature; the declared content type is not trusted. PNG: the 8-byte
 * signature (W3C PNG specification, 2nd ed., §5.2); JPEG: the SOI marker FF D8 followed by another marker
 * (ITU-T T.81, Annex B); WebP: a RIFF container whose form type is "WEBP" (RFC 9649, §2.5).
 */
export function sniffPhotoType(bytes: Uint8Array): PhotoType | null {
  if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'image/png'
  if (startsWith(bytes, [0xff, 0xd8, 0xff])) return 'image/jpeg'
  if (startsWith(bytes, ascii('RIFF')) && startsWith(bytes, ascii('WEBP'), 8)) return 'image/webp'
  return null
}
