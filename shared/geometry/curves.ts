import { applyToPoint, applyToVector, type Matrix } from './matrix.js'

/**
 * Exact curve segments in absolute coordinates. An elliptical arc is kept in centre form
 * P(θ) = centre + u·cos θ + v·sin θ for θ from startAngle to startAngle + sweepAngle, which stays exact
 * under any affine transform (u and v are transformed as vectors).
 */
export type Segment =
  | { kind: 'line'; from: [number, number]; to: [number, number] }
  | { kind: 'quad'; from: [number, number]; control: [number, number]; to: [number, number] }
  | { kind: 'cubic'; from: [number, number]; control1: [number, number]; control2: [number, number]; to: [number, number] }
  | { kind: 'arc'; centre: [number, number]; u: [number, number]; v: [number, number]; startAngle: number; sweepAngle: number }

/** One subpath: its segments in order, and whether it was closed (Z, or ends where it starts). */
export interface Contour {
  segments: Segment[]
  closed: boolean
}

/**
 * Endpoint to centre parameterisation of an SVG arc, W3C SVG 1.1 Appendix F.6.5, with out-of-range radii
 * scaled up by √Λ (F.6.6). Returns a line when a radius is zero (F.6.2) and nothing when the endpoints coincide.
 */
export function arcToSegment(
  x1: number,
  y1: number,
  rxIn: number,
  ryIn: number,
  xAxisRotationDeg: number,
  largeArc: boolean,
  sweep: boolean,
  x2: number,
  y2: number,
): Segment | undefined {
  if (x1 === x2 && y1 === y2) return undefined
  let rx = Math.abs(rxIn)
  let ry = Math.abs(ryIn)
  if (rx === 0 || ry === 0) return { kind: 'line', from: [x1, y1], to: [x2, y2] }
  const phi = (((xAxisRotationDeg % 360) + 360) % 360) * (Math.PI / 180)
  const cosPhi = Math.cos(phi)
  const sinPhi = Math.sin(phi)
  // F.6.5.1
  const dx2 = (x1 - x2) / 2
  const dy2 = (y1 - y2) / 2
  const x1p = cosPhi * dx2 + sinPhi * dy2
  const y1p = -sinPhi * dx2 + cosPhi * dy2
  // F.6.6.2 – 3: radii too small for the endpoints are scaled up.
  const lambda = (x1p * x1p) / (rx * rx) + (y1p * y1p) / (ry * ry)
  if (lambda > 1) {
    const scale = Math.sqrt(lambda)
    rx *= scale
    ry *= scale
  }
  // F.6.5.2
  const rx2 = rx * rx
  const ry2 = ry * ry
  const numerator = rx2 * ry2 - rx2 * y1p * y1p - ry2 * x1p * x1p
  const denominator = rx2 * y1p * y1p + ry2 * x1p * x1p
  let coefficient = Math.sqrt(Math.max(0, numerator / denominator))
  if (largeArc === sweep) coefficient = -coefficient
  const cxp = (coefficient * rx * y1p) / ry
  const cyp = (-coefficient * ry * x1p) / rx
  // F.6.5.3
  const cx = cosPhi * cxp - sinPhi * cyp + (x1 + x2) / 2
  const cy = sinPhi * cxp + cosPhi * cyp + (y1 + y2) / 2
  // F.6.5.5 – 6
  const angle = (ux: number, uy: number, vx: number, vy: number) => Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy)
  const startAngle = angle(1, 0, (x1p - cxp) / rx, (y1p - cyp) / ry)
  let sweepAngle = angle((x1p - cxp) / rx, (y1p - cyp) / ry, (-x1p - cxp) / rx, (-y1p - cyp) / ry)
  if (!sweep && sweepAngle > 0) sweepAngle -= 2 * Math.PI
  else if (sweep && sweepAngle < 0) sweepAngle += 2 * Math.PI
  return { kind: 'arc', centre: [cx, cy], u: [rx * cosPhi, rx * sinPhi], v: [-ry * sinPhi, ry * cosPhi], startAngle, sweepAngle }
}

/** A full ellipse (or circle) as one closed contour of two half arcs. */
export function ellipseContour(cx: number, cy: number, rx: number, ry: number): Contour {
  const u: [number, number] = [rx, 0]
  const v: [number, number] = [0, ry]
  return {
    closed: true,
    segments: [
      { kind: 'arc', centre: [cx, cy], u, v, startAngle: 0, sweepAngle: Math.PI },
      { kind: 'arc', centre: [cx, cy], u, v, startAngle: Math.PI, sweepAngle: Math.PI },
    ],
  }
}

export function transformSegment(segment: Segment, matrix: Matrix): Segment {
  const point = (p: [number, number]) => applyToPoint(matrix, p[0], p[1])
  switch (segment.kind) {
    case 'line':
      return { kind: 'line', from: point(segment.from), to: point(segment.to) }
    case 'quad':
      return { kind: 'quad', from: point(segment.from), control: point(segment.control), to: point(segment.to) }
    case 'cubic':
      return { kind: 'cubic', from: point(segment.from), control1: point(segment.control1), control2: point(segment.control2), to: point(segment.to) }
    case 'arc':
      return {
        kind: 'arc',
        centre: point(segment.centre),
        u: applyToVector(matrix, segment.u[0], segment.u[1]),
        v: applyToVector(matrix, segment.v[0], segment.v[1]),
        startAngle: segment.startAngle,
        sweepAngle: segment.sweepAngle,
      }
  }
}

export function pointAt(segment: Segment, t: number): [number, number] {
  switch (segment.kind) {
    case 'line':
      return [segment.from[0] + (segment.to[0] - segment.from[0]) * t, segment.from[1] + (segment.to[1] - segment.from[1]) * t]
    case 'quad': {
      const s = 1 - t
      return [
        s * s * segment.from[0] + 2 * s * t * segment.control[0] + t * t * segment.to[0],
        s * s * segment.from[1] + 2 * s * t * segment.control[1] + t * t * segment.to[1],
      ]
    }
    case 'cubic': {
      const s = 1 - t
      const a = s * s * s
      const b = 3 * s * s * t
      const c = 3 * s * t * t
      const d = t * t * t
      return [
        a * segment.from[0] + b * segment.control1[0] + c * segment.control2[0] + d * segment.to[0],
        a * segment.from[1] + b * segment.control1[1] + c * segment.control2[1] + d * segment.to[1],
      ]
    }
    case 'arc': {
      const theta = segment.startAngle + segment.sweepAngle * t
      const cos = Math.cos(theta)
      const sin = Math.sin(theta)
      return [segment.centre[0] + segment.u[0] * cos + segment.v[0] * sin, segment.centre[1] + segment.u[1] * cos + segment.v[1] * sin]
    }
  }
}

/** Derivative dP/dt at parameter t. */
function derivativeAt(segment: Segment, t: number): [number, number] {
  let dx: number
  let dy: number
  switch (segment.kind) {
    case 'line':
      dx = segment.to[0] - segment.from[0]
      dy = segment.to[1] - segment.from[1]
      break
    case 'quad': {
      const s = 1 - t
      dx = 2 * s * (segment.control[0] - segment.from[0]) + 2 * t * (segment.to[0] - segment.control[0])
      dy = 2 * s * (segment.control[1] - segment.from[1]) + 2 * t * (segment.to[1] - segment.control[1])
      break
    }
    case 'cubic': {
      const s = 1 - t
      dx = 3 * s * s * (segment.control1[0] - segment.from[0]) + 6 * s * t * (segment.control2[0] - segment.control1[0]) + 3 * t * t * (segment.to[0] - segment.control2[0])
      dy = 3 * s * s * (segment.control1[1] - segment.from[1]) + 6 * s * t * (segment.control2[1] - segment.control1[1]) + 3 * t * t * (segment.to[1] - segment.control2[1])
      break
    }
    case 'arc': {
      const theta = segment.startAngle + segment.sweepAngle * t
      const cos = Math.cos(theta)
      const sin = Math.sin(theta)
      dx = (-segment.u[0] * sin + segment.v[0] * cos) * segment.sweepAngle
      dy = (-segment.u[1] * sin + segment.v[1] * cos) * segment.sweepAngle
      break
    }
  }
  return [dx, dy]
}

function speedAt(segment: Segment, t: number): number {
  const [dx, dy] = derivativeAt(segment, t)
  return Math.hypot(dx, dy)
}

// 10-point Gauss–Legendre nodes and weights on [-1, 1] (Abramowitz & Stegun, Table 25.4).
const gaussNodes = [
  -0.9739065285171717, -0.8650633666889845, -0.6794095682990244, -0.4333953941292472, -0.1488743389816312, 0.1488743389816312, 0.4333953941292472,
  0.6794095682990244, 0.8650633666889845, 0.9739065285171717,
]
const gaussWeights = [
  0.0666713443086881, 0.1494513491505806, 0.219086362515982, 0.2692667193099963, 0.2955242247147529, 0.2955242247147529, 0.2692667193099963,
  0.219086362515982, 0.1494513491505806, 0.0666713443086881,
]

/** (x·y' − y·x') / 2 at parameter t: integrated along a closed contour it gives the enclosed signed area (Green's theorem). */
function areaIntegrandAt(segment: Segment, t: number): number {
  const [x, y] = pointAt(segment, t)
  const [dx, dy] = derivativeAt(segment, t)
  return (x * dy - y * dx) / 2
}

/** Signed area enclosed by a closed contour along its true curves (Gauss–Legendre on each segment). */
export function contourSignedArea(contour: Contour): number {
  let total = 0
  for (const segment of contour.segments) {
    if (segment.kind === 'line') {
      total += (segment.from[0] * segment.to[1] - segment.to[0] * segment.from[1]) / 2
      continue
    }
    // Arcs are split so each Gauss interval spans at most a quarter turn.
    const pieces = segment.kind === 'arc' ? Math.max(1, Math.ceil(Math.abs(segment.sweepAngle) / (Math.PI / 2))) : 1
    for (let piece = 0; piece < pieces; piece++) {
      const t0 = piece / pieces
      const t1 = (piece + 1) / pieces
      const half = (t1 - t0) / 2
      const middle = (t0 + t1) / 2
      let sum = 0
      for (let index = 0; index < gaussNodes.length; index++) sum += gaussWeights[index]! * areaIntegrandAt(segment, middle + half * gaussNodes[index]!)
      total += sum * half
    }
  }
  return total
}

function gaussLength(segment: Segment, t0: number, t1: number): number {
  const half = (t1 - t0) / 2
  const middle = (t0 + t1) / 2
  let sum = 0
  for (let index = 0; index < gaussNodes.length; index++) sum += gaussWeights[index]! * speedAt(segment, middle + half * gaussNodes[index]!)
  return sum * half
}

function adaptiveLength(segment: Segment, t0: number, t1: number, whole: number, depth: number): number {
  const middle = (t0 + t1) / 2
  const left = gaussLength(segment, t0, middle)
  const right = gaussLength(segment, middle, t1)
  if (depth >= 20 || Math.abs(left + right - whole) <= 1e-10 * Math.max(1, Math.abs(whole))) return left + right
  return adaptiveLength(segment, t0, middle, left, depth + 1) + adaptiveLength(segment, middle, t1, right, depth + 1)
}

/** True arc length of a segment by adaptive Gauss–Legendre quadrature of its speed (not of a polyline). */
export function segmentLength(segment: Segment): number {
  if (segment.kind === 'line') return Math.hypot(segment.to[0] - segment.from[0], segment.to[1] - segment.from[1])
  return adaptiveLength(segment, 0, 1, gaussLength(segment, 0, 1), 0)
}

export function contourLength(contour: Contour): number {
  let total = 0
  for (const segment of contour.segments) total += segmentLength(segment)
  return total
}

/**
 * How many equal parameter steps keep the chord within `toleranceMm` of the curve. Uses the bound
 * deviation ≤ max|P''| · h² / 8 for a step h of the parameter.
 */
function flatteningSteps(segment: Segment, tolerance: number): number {
  let secondDerivativeBound: number
  switch (segment.kind) {
    case 'line':
      return 1
    case 'quad':
      secondDerivativeBound = 2 * Math.hypot(segment.from[0] - 2 * segment.control[0] + segment.to[0], segment.from[1] - 2 * segment.control[1] + segment.to[1])
      break
    case 'cubic': {
      const first = Math.hypot(segment.from[0] - 2 * segment.control1[0] + segment.control2[0], segment.from[1] - 2 * segment.control1[1] + segment.control2[1])
      const second = Math.hypot(segment.control1[0] - 2 * segment.control2[0] + segment.to[0], segment.control1[1] - 2 * segment.control2[1] + segment.to[1])
      secondDerivativeBound = 6 * Math.max(first, second)
      break
    }
    case 'arc': {
      const largestRadius = Math.hypot(segment.u[0], segment.u[1]) + Math.hypot(segment.v[0], segment.v[1])
      secondDerivativeBound = largestRadius * segment.sweepAngle * segment.sweepAngle
      break
    }
  }
  const steps = Math.ceil(Math.sqrt(secondDerivativeBound / (8 * tolerance)))
  return Math.min(Math.max(steps, 1), 10_000)
}

/**
 * Flattens a contour to a polyline whose chords stay within `tolerance` of the true curve.
 * The first point is the contour's start; a closed contour does not repeat it at the end.
 */
export function flattenContour(contour: Contour, tolerance: number): [number, number][] {
  const points: [number, number][] = []
  for (const segment of contour.segments) {
    if (points.length === 0) points.push(pointAt(segment, 0))
    const steps = flatteningSteps(segment, tolerance)
    for (let step = 1; step <= steps; step++) points.push(pointAt(segment, step / steps))
  }
  if (contour.closed && points.length > 1) {
    const first = points[0]!
    const last = points[points.length - 1]!
    if (Math.hypot(first[0] - last[0], first[1] - last[1]) < 1e-9) points.pop()
  }
  return points
}

export function contourStart(contour: Contour): [number, number] | undefined {
  const first = contour.segments[0]
  return first ? pointAt(first, 0) : undefined
}

export function contourEnd(contour: Contour): [number, number] | undefined {
  const last = contour.segments[contour.segments.length - 1]
  return last ? pointAt(last, 1) : undefined
}
