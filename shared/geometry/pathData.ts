import { arcToSegment, type Contour, type Segment } from './curves.js'

export interface ParsedPathData {
  contours: Contour[]
  /** Set when the data has an error: it is drawn up to the error, as SVG renders it (SVG 1.1 Appendix F.2). */
  error?: string
}

const parameterCounts: Record<string, number> = { m: 2, l: 2, h: 1, v: 1, c: 6, s: 4, q: 4, t: 2, a: 7, z: 0 }

/** Tokeniser for the path data grammar of W3C SVG 1.1 §8.3.9 (numbers may have leading zeros, arc flags are single digits). */
class PathScanner {
  index = 0
  constructor(readonly text: string) {}

  skipSeparators(allowComma: boolean) {
    while (this.index < this.text.length) {
      const char = this.text[this.index]!
      if (char === ' ' || char === '\t' || char === '\n' || char === '\r' || char === '\f' || (allowComma && char === ',')) this.index++
      else break
    }
  }

  atEnd() {
    this.skipSeparators(false)
    return this.index >= this.text.length
  }

  /** Reads a number; returns undefined (without moving) when none starts here. */
  number(): number | undefined {
    const match = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/.exec(this.text.slice(this.index, this.index + 64))
    if (!match) return undefined
    this.index += match[0].length
    return Number(match[0])
  }

  flag(): number | undefined {
    const char = this.text[this.index]
    if (char !== '0' && char !== '1') return undefined
    this.index++
    return char === '1' ? 1 : 0
  }
}

/**
 * Reads SVG path data (every command, absolute and relative, smooth curves, arcs) into contours of exact
 * segments in user units. Degenerate input gives no contours; an error ends the data where it occurs.
 */
export function parsePathData(data: string): ParsedPathData {
  const scanner = new PathScanner(data)
  const contours: Contour[] = []
  let current: Contour | undefined
  let x = 0
  let y = 0
  let startX = 0
  let startY = 0
  // Reflected control points for S and T (SVG 1.1 §8.3.6, §8.3.7).
  let lastCubicControl: [number, number] | undefined
  let lastQuadControl: [number, number] | undefined
  let error: string | undefined

  const push = (segment: Segment | undefined) => {
    if (!segment) return
    if (!current) {
      current = { segments: [], closed: false }
      contours.push(current)
    }
    current.segments.push(segment)
  }

  let command: string | undefined
  let first = true
  while (!scanner.atEnd()) {
    const char = scanner.text[scanner.index]!
    if (/[a-zA-Z]/.test(char)) {
      if (parameterCounts[char.toLowerCase()] === undefined) {
        error = `unknown command "${char}" at position ${scanner.index}`
        break
      }
      command = char
      scanner.index++
      if (first && command.toLowerCase() !== 'm') {
        error = 'path data must start with a moveto (M or m)'
        break
      }
      first = false
      if (command.toLowerCase() === 'z') {
        if (current) {
          if (x !== startX || y !== startY) push({ kind: 'line', from: [x, y], to: [startX, startY] })
          current.closed = true
        }
        // A command after Z without M starts a new subpath at the same start point (SVG 1.1 §8.3.3).
        current = undefined
        x = startX
        y = startY
        lastCubicControl = undefined
        lastQuadControl = undefined
        continue
      }
    } else if (!command || command.toLowerCase() === 'z') {
      error = `a number without a command at position ${scanner.index}`
      break
    }

    const lower = command!.toLowerCase()
    const relative = command !== command!.toUpperCase()
    const values: number[] = []
    for (let index = 0; index < parameterCounts[lower]!; index++) {
      scanner.skipSeparators(index > 0)
      const isFlag = lower === 'a' && (index === 3 || index === 4)
      const value = isFlag ? scanner.flag() : scanner.number()
      if (value === undefined) {
        error = `command ${command} is missing a number at position ${scanner.index}`
        break
      }
      if (!Number.isFinite(value)) {
        error = 'path data has a number that is not finite'
        break
      }
      values.push(value)
    }
    if (error) break
    scanner.skipSeparators(true)

    const ox = relative ? x : 0
    const oy = relative ? y : 0
    let cubicControl: [number, number] | undefined
    let quadControl: [number, number] | undefined
    switch (lower) {
      case 'm':
        current = undefined
        x = startX = values[0]! + ox
        y = startY = values[1]! + oy
        // Further pairs after a moveto are implicit linetos (SVG 1.1 §8.3.2).
        command = relative ? 'l' : 'L'
        break
      case 'l':
        push({ kind: 'line', from: [x, y], to: [values[0]! + ox, values[1]! + oy] })
        x = values[0]! + ox
        y = values[1]! + oy
        break
      case 'h':
        push({ kind: 'line', from: [x, y], to: [values[0]! + ox, y] })
        x = values[0]! + ox
        break
      case 'v':
        push({ kind: 'line', from: [x, y], to: [x, values[0]! + oy] })
        y = values[0]! + oy
        break
      case 'c':
      case 's': {
        let control1: [number, number]
        let rest: number[]
        if (lower === 'c') {
          control1 = [values[0]! + ox, values[1]! + oy]
          rest = values.slice(2)
        } else {
          control1 = lastCubicControl ? [2 * x - lastCubicControl[0], 2 * y - lastCubicControl[1]] : [x, y]
          rest = values
        }
        const control2: [number, number] = [rest[0]! + ox, rest[1]! + oy]
        const end: [number, number] = [rest[2]! + ox, rest[3]! + oy]
        push({ kind: 'cubic', from: [x, y], control1, control2, to: end })
        cubicControl = control2
        ;[x, y] = end
        break
      }
      case 'q':
      case 't': {
        let control: [number, number]
        let end: [number, number]
        if (lower === 'q') {
          control = [values[0]! + ox, values[1]! + oy]
          end = [values[2]! + ox, values[3]! + oy]
        } else {
          control = lastQuadControl ? [2 * x - lastQuadControl[0], 2 * y - lastQuadControl[1]] : [x, y]
          end = [values[0]! + ox, values[1]! + oy]
        }
        push({ kind: 'quad', from: [x, y], control, to: end })
        quadControl = control
        ;[x, y] = end
        break
      }
      case 'a': {
        const endX = values[5]! + ox
        const endY = values[6]! + oy
        push(arcToSegment(x, y, values[0]!, values[1]!, values[2]!, values[3] === 1, values[4] === 1, endX, endY))
        x = endX
        y = endY
        break
      }
    }
    lastCubicControl = cubicControl
    lastQuadControl = quadControl
  }
  return { contours: contours.filter((contour) => contour.segments.length > 0), error }
}
