import { crc32, deflateSync } from 'node:zlib'

/**
 * A real PNG of one colour, built by hand: signature, IHDR (8-bit RGB), one IDAT, IEND, each chunk with its CRC
 * (W3C PNG specification, 2nd ed., §5.2–5.3 and §11.2). Browsers and image tools open it.
 */
export function solidPng(width: number, height: number, rgb: [number, number, number]): Buffer {
  const chunk = (type: string, data: Buffer) => {
    const length = Buffer.alloc(4)
    length.writeUInt32BE(data.length)
    const body = Buffer.concat([Buffer.from(type, 'ascii'), data])
    const crc = Buffer.alloc(4)
    crc.writeUInt32BE(crc32(body))
    return Buffer.concat([length, body, crc])
  }
  const header = Buffer.alloc(13)
  header.writeUInt32BE(width, 0)
  header.writeUInt32BE(height, 4)
  header.set([8, 2, 0, 0, 0], 8)
  const row = Buffer.concat([Buffer.from([0]), Buffer.from(Array.from({ length: width }, () => rgb).flat())])
  const pixels = Buffer.concat(Array.from({ length: height }, () => row))
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', header), chunk('IDAT', deflateSync(pixels)), chunk('IEND', Buffer.alloc(0))])
}

/** The first bytes of a JPEG (SOI, then an APP0 "JFIF" marker; ITU-T T.81 Annex B) and of a WebP (RFC 9649 §2.5). */
export const jpegStart = Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01])
export const webpStart = Buffer.concat([Buffer.from('RIFF', 'ascii'), Buffer.from([0x1a, 0, 0, 0]), Buffer.from('WEBPVP8 ', 'ascii')])
