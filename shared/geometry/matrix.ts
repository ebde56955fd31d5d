/**
 * 2-D affine transforms as SVG writes them: [a, b, c, d, e, f] maps (x, y) to (a·x + c·y + e, b·x + d·y + f)
 * (W3C SVG 1.1 §7.4 "The transform attribute").
 */
export type Matrix = readonly [number, number, number, number, number, number]
export type Point = readonly [number, number]

export const identity: Matrix = [1, 0, 0, 1, 0, 0]

/** left × right: apply `right` first, then `left` (as nested SVG transforms compose, outer × inner). */
export function multiply(left: Matrix, right: Matrix): Matrix {
  const [a1, b1, c1, d1, e1, f1] = left
  const [a2, b2, c2, d2, e2, f2] = right
  return [a1 * a2 + c1 * b2, b1 * a2 + d1 * b2, a1 * c2 + c1 * d2, b1 * c2 + d1 * d2, a1 * e2 + c1 * f2 + e1, b1 * e2 + d1 * f2 + f1]
}

export function applyToPoint(matrix: Matrix, x: number, y: number): [number, number] {
  return [matrix[0] * x + matrix[2] * y + matrix[4], matrix[1] * x + matrix[3] * y + matrix[5]]
}

/** Applies only the linear part (for direction vectors). */
export function applyToVector(matrix: Matrix, x: number, y: number): [number, number] {
  return [matrix[0] * x + matrix[2] * y, matrix[1] * x + matrix[3] * y]
}

export function determinant(matrix: Matrix): number {
  return matrix[0] * matrix[3] - matrix[1] * matrix[2]
}

export const translation = (x: number, y: number): Matrix => [1, 0, 0, 1, x, y]
export const scaling = (x: number, y: number = x): Matrix => [x, 0, 0, y, 0, 0]
export function rotation(angleDeg: number, centreX = 0, centreY = 0): Matrix {
  const radians = (angleDeg * Math.PI) / 180
  const cos = Math.cos(radians)
  const sin = Math.sin(radians)
  const turn: Matrix = [cos, sin, -sin, cos, 0, 0]
  if (centreX === 0 && centreY === 0) return turn
  return multiply(translation(centreX, centreY), multiply(turn, translation(-centreX, -centreY)))
}
export const skewX = (angleDeg: number): Matrix => [1, 0, Math.tan((angleDeg * Math.PI) / 180), 1, 0, 0]
export const skewY = (angleDeg: number): Matrix => [1, Math.tan((angleDeg * Math.PI) / 180), 0, 1, 0, 0]

const numberPattern = /[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/g
const transformPattern = /(matrix|translate|scale|rotate|skewX|skewY)\s*\(([^)]*)\)/g

export class TransformSyntaxError extends Error {}

/**
 * Parses an SVG `transform` attribute into one matrix. The list applies right to left
 * (`translate(10) scale(2)` scales first). Throws TransformSyntaxError on a malformed list.
 */
export function parseTransform(text: string | undefined): Matrix {
  if (!text || !text.trim()) return identity
  let result: Matrix = identity
  let consumed = ''
  for (const match of text.matchAll(transformPattern)) {
    consumed += match[0]
    const name = match[1]!
    const args = (match[2]!.match(numberPattern) ?? []).map(Number)
    if (args.some((value) => !Number.isFinite(value))) throw new TransformSyntaxError(`transform "${text}" has a number that is not finite`)
    const count = args.length
    const expect = (allowed: number[]) => {
      if (!allowed.includes(count)) throw new TransformSyntaxError(`${name}() in transform "${text}" takes ${allowed.join(' or ')} numbers, not ${count}`)
    }
    let step: Matrix
    switch (name) {
      case 'matrix':
        expect([6])
        step = args as unknown as Matrix
        break
      case 'translate':
        expect([1, 2])
        step = translation(args[0]!, args[1] ?? 0)
        break
      case 'scale':
        expect([1, 2])
        step = scaling(args[0]!, args[1] ?? args[0]!)
        break
      case 'rotate':
        expect([1, 3])
        step = rotation(args[0]!, args[1] ?? 0, args[2] ?? 0)
        break
      case 'skewX':
        expect([1])
        step = skewX(args[0]!)
        break
      default:
        expect([1])
        step = skewY(args[0]!)
    }
    result = multiply(result, step)
  }
  const leftover = text.replace(transformPattern, '').replace(/[\s,]/g, '')
  if (leftover.length > 0 || consumed.length === 0) throw new TransformSyntaxError(`transform "${text}" could not be read`)
  return result
}
