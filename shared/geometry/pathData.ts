import SvgPath from 'svgpath'
import { arcToSegment, type Contour, type Segment } from './curves.js'

export interface ParsedPathData {
  contours: Contour[]
  /** The parser's message when the data has an error; SVG renders up to the error, and so do we (SVG 1.1 §8.3.9). */
  error?: string
}

/**
 * Reads SVG path data (every command, absolute and relative, smooth curves, arcs) into contours of exact
 * segments in user units. Degenerate input gives no contours; non-finite numbers are an error.
 */
export function parsePathData(data: string): ParsedPathData {
  const path = new SvgPath(data)
  const error = (path as unknown as { err: string }).err || undefined
  path.abs().unshort()
  const contours: Contour[] = []
  let current: Contour | undefined
  let x = 0
  let y = 0
  let startX = 0
  let startY = 0
  let invalidNumber = false

  const push = (segment: Segment | undefined) => {
    if (!segment) return
    if (!current) {
      current = { segments: [], closed: false }
      contours.push(current)
    }
    current.segments.push(segment)
  }

  for (const segment of (path as unknown as { segments: (string | number)[][] }).segments) {
    const command = segment[0] as string
    const args = segment.slice(1) as number[]
    if (args.some((value) => !Number.isFinite(value))) {
      invalidNumber = true
      break
    }
    switch (command) {
      case 'M':
        current = undefined
        x = startX = args[0]!
        y = startY = args[1]!
        break
      case 'L':
        push({ kind: 'line', from: [x, y], to: [args[0]!, args[1]!] })
        x = args[0]!
        y = args[1]!
        break
      case 'H':
        push({ kind: 'line', from: [x, y], to: [args[0]!, y] })
        x = args[0]!
        break
      case 'V':
        push({ kind: 'line', from: [x, y], to: [x, args[0]!] })
        y = args[0]!
        break
      case 'C':
        push({ kind: 'cubic', from: [x, y], control1: [args[0]!, args[1]!], control2: [args[2]!, args[3]!], to: [args[4]!, args[5]!] })
        x = args[4]!
        y = args[5]!
        break
      case 'Q':
        push({ kind: 'quad', from: [x, y], control: [args[0]!, args[1]!], to: [args[2]!, args[3]!] })
        x = args[2]!
        y = args[3]!
        break
      case 'A':
        push(arcToSegment(x, y, args[0]!, args[1]!, args[2]!, args[3] === 1, args[4] === 1, args[5]!, args[6]!))
        x = args[5]!
        y = args[6]!
        break
      case 'Z':
        if (current) {
          if (x !== startX || y !== startY) push({ kind: 'line', from: [x, y], to: [startX, startY] })
          current.closed = true
        }
        // A command after Z without M starts a new subpath at the same start point (SVG 1.1 §8.3.3).
        current = undefined
        x = startX
        y = startY
        break
    }
  }
  const nonEmpty = contours.filter((contour) => contour.segments.length > 0)
  if (invalidNumber) return { contours: nonEmpty, error: 'path data has a number that is not finite' }
  return { contours: nonEmpty, error }
}
