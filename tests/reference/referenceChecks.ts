import { expect } from 'vitest'
import type { Box } from '../../shared/geometry/polygon.js'

export const svgNamespace = 'xmlns="http://www.w3.org/2000/svg"'

/**
 * A document whose user unit is exactly 1 mm: width/height in mm and a viewBox of the same numbers
 * (W3C SVG 1.1 §7.7: the viewBox maps onto the viewport; equal sizes give scale 1).
 */
export function millimetreDocument(body: string, widthMm = 100, heightMm = 100): string {
  return `<svg ${svgNamespace} width="${widthMm}mm" height="${heightMm}mm" viewBox="0 0 ${widthMm} ${heightMm}">${body}</svg>`
}

/** Fails with both values in the message when |actual − expected| / |expected| exceeds the tolerance. */
export function expectRelativelyClose(actual: number, expected: number, tolerance: number, label: string): void {
  const relative = Math.abs(actual - expected) / Math.abs(expected)
  expect(relative, `${label}: ours ${actual}, reference ${expected}, relative difference ${relative}`).toBeLessThanOrEqual(tolerance)
}

/** Fails with both values in the message when |actual − expected| exceeds the tolerance. */
export function expectAbsolutelyClose(actual: number, expected: number, tolerance: number, label: string): void {
  const difference = Math.abs(actual - expected)
  expect(difference, `${label}: ours ${actual}, reference ${expected}, difference ${difference}`).toBeLessThanOrEqual(tolerance)
}

/** Each edge of the box within the tolerance (mm). */
export function expectBoxClose(actual: Box, expected: Box, toleranceMm: number, label: string): void {
  for (const edge of ['minX', 'minY', 'maxX', 'maxY'] as const) expectAbsolutelyClose(actual[edge], expected[edge], toleranceMm, `${label} ${edge}`)
}

export const box = (minX: number, minY: number, maxX: number, maxY: number): Box => ({ minX, minY, maxX, maxY })

/**
 * Composite Simpson's rule with `intervals` (even) steps: an integration of our own, independent of the
 * importer's adaptive Gauss–Legendre quadrature.
 */
export function simpson(integrand: (t: number) => number, from: number, to: number, intervals = 4000): number {
  const step = (to - from) / intervals
  let sum = integrand(from) + integrand(to)
  for (let index = 1; index < intervals; index++) sum += (index % 2 === 1 ? 4 : 2) * integrand(from + index * step)
  return (sum * step) / 3
}

/** Arc length of an ellipse with semi-axes a, b between parameter angles θ0 and θ1 (rotation does not change it). */
export function ellipseArcLength(a: number, b: number, startAngle: number, endAngle: number): number {
  const lower = Math.min(startAngle, endAngle)
  const upper = Math.max(startAngle, endAngle)
  return simpson((theta) => Math.hypot(a * Math.sin(theta), b * Math.cos(theta)), lower, upper)
}

/**
 * Ramanujan's first approximation of the ellipse perimeter, π[3(a+b) − √((3a+b)(a+3b))].
 * Source: S. Ramanujan (1914), "Modular equations and approximations to π", Quart. J. Pure Appl. Math. 45.
 */
export function ramanujanPerimeter(a: number, b: number): number {
  return Math.PI * (3 * (a + b) - Math.sqrt((3 * a + b) * (a + 3 * b)))
}
