import { describe, expect, it } from 'vitest'
import { importSvg } from '../../shared/geometry/importSvg.js'
import { box, expectBoxClose, expectRelativelyClose, millimetreDocument, svgNamespace } from './referenceChecks.js'

/**
 * Straight-edged pieces pass through the boolean step on a 1 µm grid, so a corner can move by half a
 * micrometre: bounding boxes are compared within 1 µm. Areas of unchanged pieces are taken from the true
 * outline and are compared to 1e-9.
 */
const gridToleranceMm = 1e-3

// Millimetres per unit. Source: W3C CSS Values and Units Module Level 3, "Absolute lengths":
// 1in = 2.54cm = 25.4mm = 96px, 1pt = 1/72 in, 1pc = 1/6 in, 1Q = 1/40 cm.
const millimetresPer = {
  in: 25.4,
  cm: 10,
  mm: 1,
  pt: 25.4 / 72,
  pc: 25.4 / 6,
  Q: 10 / 40,
  px: 25.4 / 96,
} as const

describe('document size units (W3C CSS Values and Units Level 3, "Absolute lengths")', () => {
  // Each document is 2n units wide with viewBox 0 0 2n 2n, so one user unit is one of the named unit; the square
  // is n × n user units, placed from n/2 to 3n/2. n is chosen so every square is about 100 mm wide.
  const cases = [
    { unit: 'in', count: 4 },
    { unit: 'cm', count: 10 },
    { unit: 'mm', count: 100 },
    { unit: 'pt', count: 288 },
    { unit: 'pc', count: 24 },
    { unit: 'Q', count: 400 },
    { unit: 'px', count: 384 },
  ] as const

  for (const { unit, count } of cases) {
    it(`maps one user unit to one ${unit} when the size is in ${unit} and the viewBox counts ${unit}`, () => {
      const side = count * millimetresPer[unit]
      const svg = `<svg ${svgNamespace} width="${2 * count}${unit}" height="${2 * count}${unit}" viewBox="0 0 ${2 * count} ${2 * count}">
        <rect x="${count / 2}" y="${count / 2}" width="${count}" height="${count}"/></svg>`

      const design = importSvg(svg)

      expectRelativelyClose(design.widthMm, 2 * side, 1e-12, `${unit} document width`)
      expectRelativelyClose(design.heightMm, 2 * side, 1e-12, `${unit} document height`)
      expectRelativelyClose(design.areaMm2, side * side, 1e-9, `${unit} square area`)
      expectRelativelyClose(design.cutLengthMm, 4 * side, 1e-9, `${unit} square cut length`)
      expectBoxClose(design.bbox, box(side / 2, side / 2, (3 * side) / 2, (3 * side) / 2), gridToleranceMm, `${unit} square`)
    })
  }

  it('reads user units as CSS px (96 per inch) when the document has a size but no viewBox', () => {
    // SVG 1.1 §7.10: without a viewBox, one user unit is one px; 96 px = 1 in = 25.4 mm (CSS Values 3).
    const svg = `<svg ${svgNamespace} width="4in" height="2in"><rect x="96" y="48" width="192" height="96"/></svg>`

    const design = importSvg(svg)

    expectRelativelyClose(design.widthMm, 101.6, 1e-12, 'width 4in')
    expectRelativelyClose(design.heightMm, 50.8, 1e-12, 'height 2in')
    expectRelativelyClose(design.areaMm2, 50.8 * 25.4, 1e-9, '2 in × 1 in rectangle')
    expectBoxClose(design.bbox, box(25.4, 12.7, 76.2, 38.1), gridToleranceMm, '2 in × 1 in rectangle')
  })

  it('reads a length with a unit inside the drawing as that many CSS px of user space', () => {
    // SVG 1.1 §7.10: "1in" inside user space is 96 user units (CSS Values 3); here a user unit is 1 mm,
    // so a 1in × 1cm rectangle is 96 × 37.795… mm.
    const svg = millimetreDocument('<rect x="0" y="0" width="1in" height="1cm"/>', 200, 100)

    const design = importSvg(svg)

    const inchInUserUnits = 96
    const centimetreInUserUnits = (10 / 25.4) * 96
    expectRelativelyClose(design.areaMm2, inchInUserUnits * centimetreInUserUnits, 1e-9, '1in × 1cm in user units of 1 mm')
    expectBoxClose(design.bbox, box(0, 0, inchInUserUnits, centimetreInUserUnits), gridToleranceMm, '1in × 1cm')
  })
})

describe('viewBox to viewport mapping (W3C SVG 1.1 §7.7 "The viewBox attribute")', () => {
  it('scales user units by viewport size over viewBox size (200 mm over 100 units = 2 mm per unit)', () => {
    const svg = `<svg ${svgNamespace} width="200mm" height="100mm" viewBox="0 0 100 50"><rect x="10" y="10" width="20" height="10"/></svg>`

    const design = importSvg(svg)

    // §7.7: scale = 200 mm / 100 = 100 mm / 50 = 2 mm per user unit.
    expect(design.widthMm).toBe(200)
    expect(design.heightMm).toBe(100)
    expectBoxClose(design.bbox, box(20, 20, 60, 40), gridToleranceMm, 'rectangle at scale 2')
    expectRelativelyClose(design.areaMm2, 40 * 20, 1e-9, 'rectangle area at scale 2')
    expectRelativelyClose(design.cutLengthMm, 2 * (40 + 20), 1e-9, 'rectangle perimeter at scale 2')
  })

  it('moves the viewBox origin (min-x, min-y) to the viewport origin', () => {
    const svg = `<svg ${svgNamespace} width="100mm" height="50mm" viewBox="-50 -25 100 50"><rect x="-50" y="-25" width="10" height="5"/></svg>`

    const design = importSvg(svg)

    // §7.7: the point (min-x, min-y) maps to the viewport's top-left corner.
    expectBoxClose(design.bbox, box(0, 0, 10, 5), gridToleranceMm, 'rectangle at the viewBox origin')
  })
})

describe('preserveAspectRatio (W3C SVG 1.1 §7.8)', () => {
  // A square viewBox (100 × 100) in a 200 mm × 100 mm viewport; the rectangle x 10–40, y 20–60 in user units.
  // meet: scale = min(200/100, 100/100) = 1; 100 mm of free width placed by xMin (0), xMid (50), xMax (100).
  // slice: scale = max(2, 1) = 2; the 200 mm tall content overflows by 100 mm, placed by YMin (0), YMid (−50), YMax (−100).
  const cases = [
    { value: 'xMinYMin meet', expected: box(10, 20, 40, 60) },
    { value: 'xMidYMin meet', expected: box(60, 20, 90, 60) },
    { value: 'xMaxYMin meet', expected: box(110, 20, 140, 60) },
    { value: 'xMinYMid meet', expected: box(10, 20, 40, 60) },
    { value: 'xMidYMid meet', expected: box(60, 20, 90, 60) },
    { value: 'xMaxYMid meet', expected: box(110, 20, 140, 60) },
    { value: 'xMinYMax meet', expected: box(10, 20, 40, 60) },
    { value: 'xMidYMax meet', expected: box(60, 20, 90, 60) },
    { value: 'xMaxYMax', expected: box(110, 20, 140, 60) },
    { value: 'xMinYMin slice', expected: box(20, 40, 80, 120) },
    { value: 'xMinYMid slice', expected: box(20, -10, 80, 70) },
    { value: 'xMinYMax slice', expected: box(20, -60, 80, 20) },
    { value: 'xMidYMin slice', expected: box(20, 40, 80, 120) },
    { value: 'xMidYMid slice', expected: box(20, -10, 80, 70) },
    { value: 'xMaxYMax slice', expected: box(20, -60, 80, 20) },
    // none: x scale 2, y scale 1, no alignment.
    { value: 'none', expected: box(20, 20, 80, 60) },
  ]

  for (const { value, expected } of cases) {
    it(`places the drawing as "${value}" prescribes`, () => {
      const svg = `<svg ${svgNamespace} width="200mm" height="100mm" viewBox="0 0 100 100" preserveAspectRatio="${value}">
        <rect x="10" y="20" width="30" height="40"/></svg>`

      const design = importSvg(svg)

      expectBoxClose(design.bbox, expected, gridToleranceMm, value)
      const areaScale = (expected.maxX - expected.minX) * (expected.maxY - expected.minY)
      expectRelativelyClose(design.areaMm2, areaScale, 1e-9, `${value} area`)
    })
  }

  it('defaults to xMidYMid meet when the attribute is absent', () => {
    // §7.8: the initial value is "xMidYMid meet".
    const svg = `<svg ${svgNamespace} width="100mm" height="200mm" viewBox="0 0 100 100"><rect x="10" y="20" width="30" height="40"/></svg>`

    const design = importSvg(svg)

    // A tall viewport: scale 1, 100 mm of free height split evenly above and below.
    expectBoxClose(design.bbox, box(10, 70, 40, 110), gridToleranceMm, 'default alignment')
  })
})

describe('transforms on nested groups (W3C SVG 1.1 §7.4–7.6, elementary geometry)', () => {
  const cases: { name: string; body: string; expected: ReturnType<typeof box>; areaMm2: number }[] = [
    {
      // Inner scale first, then the outer translate: x 10 + 2·5 … 10 + 2·15, y 20 + 2·5 … 20 + 2·10.
      name: 'translate around scale',
      body: '<g transform="translate(10 20)"><g transform="scale(2)"><rect x="5" y="5" width="10" height="5"/></g></g>',
      expected: box(20, 30, 40, 40),
      areaMm2: 20 * 10,
    },
    {
      // rotate(90 50 50) sends (x, y) to (50 − (y − 50), 50 + (x − 50)): corners (60,40)→(60,60), (80,50)→(50,80).
      name: 'rotate by 90° about a centre',
      body: '<g transform="rotate(90 50 50)"><rect x="60" y="40" width="20" height="10"/></g>',
      expected: box(50, 60, 60, 80),
      areaMm2: 200,
    },
    {
      // A 20 × 20 square centred on (50, 50) turned 30°: half-extent 10·(cos 30° + sin 30°).
      name: 'rotate by 30° about the square’s centre',
      body: '<g transform="rotate(30, 50, 50)"><rect x="40" y="40" width="20" height="20"/></g>',
      expected: box(50 - 10 * (Math.cos(Math.PI / 6) + 0.5), 50 - 10 * (Math.cos(Math.PI / 6) + 0.5), 50 + 10 * (Math.cos(Math.PI / 6) + 0.5), 50 + 10 * (Math.cos(Math.PI / 6) + 0.5)),
      areaMm2: 400,
    },
    {
      // skewX(30): x' = x + y·tan 30°; y unchanged. Rectangle x 10–30, y 10–40.
      name: 'skewX',
      body: '<g transform="skewX(30)"><rect x="10" y="10" width="20" height="30"/></g>',
      expected: box(10 + 10 * Math.tan(Math.PI / 6), 10, 30 + 40 * Math.tan(Math.PI / 6), 40),
      areaMm2: 600,
    },
    {
      // skewY(45): y' = y + x·tan 45° = y + x. Rectangle x 10–30, y 5–15.
      name: 'skewY',
      body: '<g transform="skewY(45)"><rect x="10" y="5" width="20" height="10"/></g>',
      expected: box(10, 15, 30, 45),
      areaMm2: 200,
    },
    {
      // matrix(a b c d e f) = (a·x + c·y + e, b·x + d·y + f) = (x − 0.5y + 30, 0.5x + y + 10); corners of the
      // unit-20 square (0,0) (20,0) (20,20) (0,20) → (30,10) (50,20) (40,40) (20,30). Determinant 1.25.
      name: 'matrix',
      body: '<g transform="matrix(1 0.5 -0.5 1 30 10)"><rect width="20" height="20"/></g>',
      expected: box(20, 10, 50, 40),
      areaMm2: 400 * 1.25,
    },
    {
      // A list applies right to left: scale(2 1) first, then rotate(90), then translate(50 50), then the outer group's
      // translate(5 −10). (x, y) → (2x, y) → (−y, 2x) → (55 − y, 40 + 2x); rectangle x 0–10, y 0–5 → x 50–55, y 40–60.
      name: 'a transform list inside a translated group',
      body: '<g transform="translate(5 -10)"><g transform="translate(50 50) rotate(90) scale(2 1)"><rect width="10" height="5"/></g></g>',
      expected: box(50, 40, 55, 60),
      areaMm2: 100,
    },
    {
      // Outer group scales by 0.5 about the origin, inner by rotate(180 40 40): (x, y) → (80 − x, 80 − y), then halved.
      // Rectangle x 10–30, y 20–30 → x 50–70, y 50–60 → x 25–35, y 25–30.
      name: 'rotate inside scale',
      body: '<g transform="scale(0.5)"><g transform="rotate(180 40 40)"><rect x="10" y="20" width="20" height="10"/></g></g>',
      expected: box(25, 25, 35, 30),
      areaMm2: 50,
    },
  ]

  for (const { name, body, expected, areaMm2 } of cases) {
    it(`lands the shape where hand-computed corners say for ${name}`, () => {
      const svg = millimetreDocument(body)

      const design = importSvg(svg)

      expectBoxClose(design.bbox, expected, gridToleranceMm, name)
      expectRelativelyClose(design.areaMm2, areaMm2, 1e-9, `${name} area (|det| × area)`)
    })
  }
})

describe('nested viewports and references', () => {
  it('maps a nested <svg> through its own x, y and viewBox', () => {
    // Nested viewport at (10, 20), 40 × 20 mm, viewBox 0 0 4 2: 10 mm per unit (SVG 1.1 §7.7, §7.9).
    const svg = millimetreDocument('<svg x="10" y="20" width="40" height="20" viewBox="0 0 4 2"><rect x="1" y="0.5" width="1" height="1"/></svg>')

    const design = importSvg(svg)

    expectBoxClose(design.bbox, box(20, 25, 30, 35), gridToleranceMm, 'nested viewport')
    expectRelativelyClose(design.areaMm2, 100, 1e-9, 'nested viewport area')
  })

  it('applies the nested <svg>’s default xMidYMid meet', () => {
    // Viewport 60 × 30 at (10, 10), viewBox 10 × 10: scale min(6, 3) = 3, 30 mm of free width split evenly (§7.8).
    const svg = millimetreDocument('<svg x="10" y="10" width="60" height="30" viewBox="0 0 10 10"><rect width="10" height="10"/></svg>')

    const design = importSvg(svg)

    expectBoxClose(design.bbox, box(25, 10, 55, 40), gridToleranceMm, 'nested meet')
  })

  it('places a <use> of a local definition at its x and y, after its own transform', () => {
    // SVG 1.1 §5.6: x/y add a translate(x, y) after the use element's transform.
    const svg = millimetreDocument(`<defs><rect id="tile" width="10" height="5"/></defs>
      <use href="#tile" x="30" y="40"/>
      <use xmlns:xlink="http://www.w3.org/1999/xlink" xlink:href="#tile" x="5" y="5" transform="scale(2)"/>`)

    const design = importSvg(svg)

    // First use: x 30–40, y 40–45. Second: (x + 5, y + 5) then ×2 → x 10–30, y 10–20.
    const boxes = design.pieces.map((piece) => piece.bbox).sort((left, right) => left.minX - right.minX)
    expect(boxes).toHaveLength(2)
    expectBoxClose(boxes[0]!, box(10, 10, 30, 20), gridToleranceMm, 'scaled use')
    expectBoxClose(boxes[1]!, box(30, 40, 40, 45), gridToleranceMm, 'translated use')
    expectRelativelyClose(design.areaMm2, 50 + 200, 1e-9, 'two uses')
  })

  it('sizes a <use> of a <symbol> with a viewBox to the use’s width and height', () => {
    // SVG 1.1 §5.6: a referenced symbol becomes an svg viewport of the use's width/height; viewBox 0 0 10 10 in 40 × 40
    // scales by 4, so the r = 5 circle becomes r = 20 centred at (20 + 20, 30 + 20). Area π·20² (elementary geometry).
    const svg = millimetreDocument(`<defs><symbol id="dot" viewBox="0 0 10 10"><circle cx="5" cy="5" r="5"/></symbol></defs>
      <use href="#dot" x="20" y="30" width="40" height="40"/>`)

    const design = importSvg(svg)

    expectRelativelyClose(design.areaMm2, Math.PI * 400, 1e-9, 'symbol circle area')
    expectRelativelyClose(design.cutLengthMm, 2 * Math.PI * 20, 1e-9, 'symbol circle perimeter')
    expectBoxClose(design.bbox, box(20, 30, 60, 70), 0.02 + gridToleranceMm, 'symbol circle')
  })
})
