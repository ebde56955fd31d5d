import { describe, expect, it } from 'vitest'
import { importSvg } from '../../shared/geometry/importSvg.js'
import { box, ellipseArcLength, expectBoxClose, expectRelativelyClose, millimetreDocument } from './referenceChecks.js'

/** Arc lengths are integrated along the true arc, so they agree with the closed forms to floating-point error. */
const exactCurveTolerance = 1e-9
/** Bounding boxes come from the flattened outline, which stays within the default 0.02 mm of the curve. */
const flatteningToleranceMm = 0.02 + 1e-6

const drawnPath = (d: string) => importSvg(millimetreDocument(`<path d="${d}" fill="none" stroke="black" stroke-width="0.1"/>`))

describe('arcs with radii too small for their endpoints (W3C SVG 1.1 Appendix F.6.6)', () => {
  it('scales radius 1 between points 10 apart up to a half circle of radius 5 (length 5π)', () => {
    // F.6.6.2–3: Λ = x1′²/rx² + y1′²/ry² = 25 > 1, so the radii grow by √Λ = 5; the centre is the chord's midpoint.
    const design = drawnPath('M0 0 A1 1 0 0 1 10 0')

    expectRelativelyClose(design.cutLengthMm, 5 * Math.PI, exactCurveTolerance, 'half circle, r = 5')
    // Sweep flag 1 goes the positive-angle way (F.6.5): from angle π to 2π, through (5, −5) with y pointing down.
    expectBoxClose(design.bbox, box(0, -5, 10, 0), flatteningToleranceMm, 'upper half circle')
  })

  it('keeps the radii ratio when scaling: rx 2, ry 1 becomes a half ellipse 5 × 2.5', () => {
    // Λ = 5²/2² + 0 = 6.25, √Λ = 2.5.
    const design = drawnPath('M0 0 A2 1 0 0 1 10 0')

    expectRelativelyClose(design.cutLengthMm, ellipseArcLength(5, 2.5, Math.PI, 2 * Math.PI), exactCurveTolerance, 'half ellipse 5 × 2.5')
    expectBoxClose(design.bbox, box(0, -2.5, 10, 0), flatteningToleranceMm, 'half ellipse 5 × 2.5')
  })

  it('scales a rotated ellipse in its own axes: rx 1, ry 2 turned 90° gives the same half ellipse 5 × 2.5', () => {
    // With φ = 90°, x1′ = 0 and y1′ = 5 (F.6.5.1); Λ = 25/4; the ellipse's own x axis is vertical (rx → 2.5).
    const design = drawnPath('M0 0 A1 2 90 0 1 10 0')

    expectRelativelyClose(design.cutLengthMm, ellipseArcLength(5, 2.5, Math.PI, 2 * Math.PI), exactCurveTolerance, 'rotated half ellipse')
    expectBoxClose(design.bbox, box(0, -2.5, 10, 0), flatteningToleranceMm, 'rotated half ellipse')
  })

  it('takes the absolute value of negative radii (F.6.6.1)', () => {
    const design = drawnPath('M0 0 A-5 -5 0 0 1 10 0')

    expectRelativelyClose(design.cutLengthMm, 5 * Math.PI, exactCurveTolerance, 'half circle from |−5|')
  })
})

describe('large-arc and sweep flags on the same endpoints (W3C SVG 1.1 §8.3.8, Appendix F.6.5)', () => {
  // From (20, 50) to (30, 50) with r = 5√2: half-chord 5, so the centre lies √(r² − 5²) = 5 from the chord's midpoint,
  // at (25, 45) or (25, 55). The short arc spans 90°, the long one 270° (elementary geometry).
  const radius = 5 * Math.SQRT2
  const cases = [
    // F.6.5.2: the centre sign is + when fA ≠ fS; with y down, + puts the centre at (25, 55).
    { flags: '0 0', centre: [25, 45], sweepDeg: 90, expected: box(20, 50, 30, 45 + radius) },
    { flags: '0 1', centre: [25, 55], sweepDeg: 90, expected: box(20, 55 - radius, 30, 50) },
    { flags: '1 0', centre: [25, 55], sweepDeg: 270, expected: box(25 - radius, 50, 25 + radius, 55 + radius) },
    { flags: '1 1', centre: [25, 45], sweepDeg: 270, expected: box(25 - radius, 45 - radius, 25 + radius, 50) },
  ] as const

  for (const { flags, centre, sweepDeg, expected } of cases) {
    it(`draws the ${sweepDeg}° arc about (${centre.join(', ')}) for large-arc/sweep flags ${flags}`, () => {
      const design = drawnPath(`M20 50 A${radius} ${radius} 0 ${flags} 30 50`)

      expectRelativelyClose(design.cutLengthMm, radius * ((sweepDeg * Math.PI) / 180), exactCurveTolerance, `flags ${flags} length r·θ`)
      expectBoxClose(design.bbox, expected, flatteningToleranceMm, `flags ${flags}`)
    })
  }

  it('encloses the lens of two 90° arcs: twice the circular segment r²/2·(θ − sin θ)', () => {
    const design = importSvg(millimetreDocument(`<path d="M20 50 A${radius} ${radius} 0 0 1 30 50 A${radius} ${radius} 0 0 1 20 50 Z"/>`))

    const segmentArea = ((radius * radius) / 2) * (Math.PI / 2 - 1)
    expectRelativelyClose(design.areaMm2, 2 * segmentArea, exactCurveTolerance, 'lens area')
    expectRelativelyClose(design.cutLengthMm, 2 * radius * (Math.PI / 2), exactCurveTolerance, 'lens outline')
  })
})

describe('rotated elliptical arcs against a parametric construction of our own (W3C SVG 1.1 Appendix F.6.3–F.6.4)', () => {
  // Each arc is built from its centre form: P(θ) = centre + R(φ)·(rx cos θ, ry sin θ) (F.6.3), and written as the
  // endpoint form of F.6.4 (fA = |Δθ| > 180°, fS = Δθ > 0). The expected length integrates |P′(θ)| with Simpson's rule;
  // the expected box comes from 20 000 points on P(θ).
  const cases = [
    { centre: [50, 50], rx: 30, ry: 12, rotationDeg: 30, startDeg: 20, sweepDeg: 130 },
    { centre: [50, 50], rx: 25, ry: 10, rotationDeg: 120, startDeg: -40, sweepDeg: -250 },
    { centre: [40, 60], rx: 20, ry: 35, rotationDeg: -45, startDeg: 200, sweepDeg: 300 },
    { centre: [50, 50], rx: 18, ry: 6, rotationDeg: 75, startDeg: 10, sweepDeg: -60 },
    // x-axis-rotation is taken modulo 360 (F.6.6): 390° draws the same arc as 30°.
    { centre: [50, 50], rx: 30, ry: 12, rotationDeg: 390, startDeg: 20, sweepDeg: 130 },
  ] as const

  const radians = (degrees: number) => (degrees * Math.PI) / 180

  for (const { centre, rx, ry, rotationDeg, startDeg, sweepDeg } of cases) {
    const phi = radians(rotationDeg)
    const pointAt = (theta: number): [number, number] => [
      centre[0] + rx * Math.cos(phi) * Math.cos(theta) - ry * Math.sin(phi) * Math.sin(theta),
      centre[1] + rx * Math.sin(phi) * Math.cos(theta) + ry * Math.cos(phi) * Math.sin(theta),
    ]
    const startAngle = radians(startDeg)
    const endAngle = radians(startDeg + sweepDeg)
    const [x1, y1] = pointAt(startAngle)
    const [x2, y2] = pointAt(endAngle)
    const largeArc = Math.abs(sweepDeg) > 180 ? 1 : 0
    const sweep = sweepDeg > 0 ? 1 : 0
    const expectedLength = ellipseArcLength(rx, ry, startAngle, endAngle)
    const samples = Array.from({ length: 20_001 }, (_, index) => pointAt(startAngle + ((endAngle - startAngle) * index) / 20_000))
    const expectedBox = box(
      Math.min(...samples.map(([x]) => x)),
      Math.min(...samples.map(([, y]) => y)),
      Math.max(...samples.map(([x]) => x)),
      Math.max(...samples.map(([, y]) => y)),
    )
    const label = `rx ${rx} ry ${ry} rotated ${rotationDeg}° from ${startDeg}° by ${sweepDeg}°`

    it(`measures the arc ${label} in absolute form`, () => {
      const design = drawnPath(`M${x1} ${y1} A${rx} ${ry} ${rotationDeg} ${largeArc} ${sweep} ${x2} ${y2}`)

      expectRelativelyClose(design.cutLengthMm, expectedLength, exactCurveTolerance, label)
      expectBoxClose(design.bbox, expectedBox, flatteningToleranceMm, label)
    })

    it(`measures the arc ${label} in relative form`, () => {
      const design = drawnPath(`m${x1} ${y1} a${rx} ${ry} ${rotationDeg} ${largeArc} ${sweep} ${x2 - x1} ${y2 - y1}`)

      expectRelativelyClose(design.cutLengthMm, expectedLength, exactCurveTolerance, `${label} (relative)`)
    })
  }
})

describe('degenerate arcs (W3C SVG 1.1 Appendix F.6.2)', () => {
  it('draws a straight line when rx is zero', () => {
    // F.6.2: "If rx = 0 or ry = 0 then treat this as a straight line segment joining the endpoints."
    const design = drawnPath('M10 10 A0 5 0 0 1 40 50')

    expectRelativelyClose(design.cutLengthMm, 50, exactCurveTolerance, '3-4-5 triangle hypotenuse, scaled by 10')
    expectBoxClose(design.bbox, box(10, 10, 40, 50), 1e-9, 'straight line')
  })

  it('draws a straight line when ry is zero', () => {
    const design = drawnPath('M10 10 A5 0 30 1 0 40 50')

    expectRelativelyClose(design.cutLengthMm, 50, exactCurveTolerance, 'straight line, ry = 0')
  })

  it('omits an arc whose endpoints coincide, keeping the rest of the path', () => {
    // F.6.2: "If the endpoints are identical, then this is equivalent to omitting the elliptical arc segment entirely."
    const design = drawnPath('M10 10 A5 5 0 1 1 10 10 L40 10')

    expect(design.cutLines).toHaveLength(1)
    expectRelativelyClose(design.cutLengthMm, 30, exactCurveTolerance, 'only the line')
    expectBoxClose(design.bbox, box(10, 10, 40, 10), 1e-9, 'only the line')
  })
})
