import { describe, expect, it } from 'vitest'
import { importSvg } from '../../shared/geometry/importSvg.js'
import { box, ellipseArcLength, expectAbsolutelyClose, expectBoxClose, expectRelativelyClose, millimetreDocument, ramanujanPerimeter } from './referenceChecks.js'

/** Curved outlines are measured along the true curves, so only floating-point error separates them from the formulas. */
const exactCurveTolerance = 1e-9
/** Flattened outlines stay within the default 0.02 mm of the curve; their corners sit on a 1 µm grid. */
const flatteningToleranceMm = 0.02 + 1e-3

describe('circles (elementary geometry: area πr², perimeter 2πr)', () => {
  for (const radius of [0.8, 5, 20, 47.5]) {
    it(`measures a circle of radius ${radius} mm along its true curve`, () => {
      const svg = millimetreDocument(`<circle cx="50" cy="50" r="${radius}"/>`)

      const design = importSvg(svg)

      expectRelativelyClose(design.areaMm2, Math.PI * radius * radius, exactCurveTolerance, 'πr²')
      expectRelativelyClose(design.cutLengthMm, 2 * Math.PI * radius, exactCurveTolerance, '2πr')
      expectBoxClose(design.bbox, box(50 - radius, 50 - radius, 50 + radius, 50 + radius), flatteningToleranceMm, 'circle')
    })
  }

  it('measures a circle drawn as two half-circle arcs in a path the same as a <circle>', () => {
    const svg = millimetreDocument('<path d="M20 50 A30 30 0 0 1 80 50 A30 30 0 0 1 20 50 Z"/>')

    const design = importSvg(svg)

    expectRelativelyClose(design.areaMm2, Math.PI * 900, exactCurveTolerance, 'πr², r = 30')
    expectRelativelyClose(design.cutLengthMm, 60 * Math.PI, exactCurveTolerance, '2πr, r = 30')
  })
})

describe('ellipses (area πab; perimeter by Ramanujan 1914)', () => {
  for (const [a, b] of [
    [30, 20],
    [40, 20],
    [45, 15],
  ] as const) {
    it(`measures an ellipse with semi-axes ${a} and ${b} mm (a/b = ${a / b})`, () => {
      const svg = millimetreDocument(`<ellipse cx="50" cy="50" rx="${a}" ry="${b}"/>`)

      const design = importSvg(svg)

      expectRelativelyClose(design.areaMm2, Math.PI * a * b, exactCurveTolerance, 'πab')
      // Ramanujan's approximation itself is far better than 1e-4 for a/b ≤ 3 (REFERENCES.md: well under 0.01 %).
      expectRelativelyClose(design.cutLengthMm, ramanujanPerimeter(a, b), 1e-4, 'Ramanujan perimeter')
      // And against an integration of our own (composite Simpson, 4000 intervals) of √(a² sin²θ + b² cos²θ).
      expectRelativelyClose(design.cutLengthMm, ellipseArcLength(a, b, 0, 2 * Math.PI), exactCurveTolerance, 'Simpson perimeter')
      expectBoxClose(design.bbox, box(50 - a, 50 - b, 50 + a, 50 + b), flatteningToleranceMm, 'ellipse')
    })
  }

  it('takes the missing ry of an ellipse from rx (SVG 2 §10.4: auto uses the other radius)', () => {
    const svg = millimetreDocument('<ellipse cx="50" cy="50" rx="25"/>')

    const design = importSvg(svg)

    expectRelativelyClose(design.areaMm2, Math.PI * 625, exactCurveTolerance, 'πr², r = 25')
  })
})

describe('rounded rectangles (SVG 1.1 §9.2; elementary geometry)', () => {
  it('subtracts (4 − π)·r² from the area and replaces 8r of straight edge by 2πr for rx = ry = r', () => {
    const [width, height, radius] = [60, 40, 8]
    const svg = millimetreDocument(`<rect x="20" y="30" width="${width}" height="${height}" rx="${radius}" ry="${radius}"/>`)

    const design = importSvg(svg)

    expectRelativelyClose(design.areaMm2, width * height - (4 - Math.PI) * radius * radius, exactCurveTolerance, 'wh − (4 − π)r²')
    expectRelativelyClose(design.cutLengthMm, 2 * (width + height) - 8 * radius + 2 * Math.PI * radius, exactCurveTolerance, '2(w + h) − 8r + 2πr')
    expectBoxClose(design.bbox, box(20, 30, 80, 70), flatteningToleranceMm, 'rounded rectangle')
  })

  it('uses quarter ellipses of rx × ry at the corners when rx ≠ ry', () => {
    const [width, height, rx, ry] = [70, 50, 15, 6]
    const svg = millimetreDocument(`<rect x="10" y="20" width="${width}" height="${height}" rx="${rx}" ry="${ry}"/>`)

    const design = importSvg(svg)

    // Four quarter ellipses make one whole ellipse: area π·rx·ry, length by our own Simpson integration.
    const cornersLength = ellipseArcLength(rx, ry, 0, 2 * Math.PI)
    expectRelativelyClose(design.areaMm2, width * height - (4 - Math.PI) * rx * ry, exactCurveTolerance, 'wh − (4 − π)·rx·ry')
    expectRelativelyClose(design.cutLengthMm, 2 * (width - 2 * rx) + 2 * (height - 2 * ry) + cornersLength, exactCurveTolerance, 'straight edges + ellipse perimeter')
  })

  it('uses rx for ry when only rx is given', () => {
    // SVG 1.1 §9.2: "if a properly specified value is provided for rx but not for ry, … ry = rx".
    const svg = millimetreDocument('<rect x="10" y="10" width="40" height="30" rx="5"/>')

    const design = importSvg(svg)

    expectRelativelyClose(design.areaMm2, 1200 - (4 - Math.PI) * 25, exactCurveTolerance, 'rx = ry = 5')
  })

  it('clamps rx to half the width, so a 40 × 20 rectangle with rx = 50, ry = 10 becomes an ellipse', () => {
    // SVG 1.1 §9.2: rx greater than half the width is set to half the width (rx → 20); ry = 10 is half the height,
    // so no straight edge is left and the outline is the ellipse with semi-axes 20 and 10.
    const svg = millimetreDocument('<rect x="10" y="10" width="40" height="20" rx="50" ry="10"/>')

    const design = importSvg(svg)

    expectRelativelyClose(design.areaMm2, Math.PI * 20 * 10, exactCurveTolerance, 'ellipse π·20·10')
    expectRelativelyClose(design.cutLengthMm, ellipseArcLength(20, 10, 0, 2 * Math.PI), exactCurveTolerance, 'ellipse perimeter')
  })
})

describe('holes and fill rules (W3C SVG 1.1 §11.3 "fill-rule")', () => {
  const outerClockwise = 'M10 10 H50 V50 H10 Z'
  const innerClockwise = 'M20 20 H40 V40 H20 Z'
  const innerAnticlockwise = 'M20 20 V40 H40 V20 Z'

  it('cuts a square hole out of a square: the area subtracts and one hole is counted', () => {
    const svg = millimetreDocument(`<path d="${outerClockwise} ${innerAnticlockwise}"/>`)

    const design = importSvg(svg)

    // Shoelace / elementary geometry: 40² − 20².
    expect(design.holeCount).toBe(1)
    expectRelativelyClose(design.areaMm2, 1600 - 400, exactCurveTolerance, 'square minus hole')
    expectRelativelyClose(design.cutLengthMm, 160 + 80, exactCurveTolerance, 'outline plus hole')
  })

  it('fills a same-direction inner square under nonzero (winding number 2), so there is no hole', () => {
    const svg = millimetreDocument(`<path fill-rule="nonzero" d="${outerClockwise} ${innerClockwise}"/>`)

    const design = importSvg(svg)

    expect(design.holeCount).toBe(0)
    expectRelativelyClose(design.areaMm2, 1600, exactCurveTolerance, 'nonzero, same direction')
  })

  it('leaves a same-direction inner square empty under evenodd (two crossings)', () => {
    const svg = millimetreDocument(`<path fill-rule="evenodd" d="${outerClockwise} ${innerClockwise}"/>`)

    const design = importSvg(svg)

    expect(design.holeCount).toBe(1)
    expectRelativelyClose(design.areaMm2, 1200, exactCurveTolerance, 'evenodd, same direction')
  })

  for (const rule of ['nonzero', 'evenodd']) {
    it(`leaves an opposite-direction inner square empty under ${rule}`, () => {
      const svg = millimetreDocument(`<path fill-rule="${rule}" d="${outerClockwise} ${innerAnticlockwise}"/>`)

      const design = importSvg(svg)

      expect(design.holeCount).toBe(1)
      expectRelativelyClose(design.areaMm2, 1200, exactCurveTolerance, `${rule}, opposite direction`)
    })
  }

  it('inherits fill-rule from a group', () => {
    // SVG 1.1 §11.3: fill-rule is inherited.
    const svg = millimetreDocument(`<g fill-rule="evenodd"><path d="${outerClockwise} ${innerClockwise}"/></g>`)

    const design = importSvg(svg)

    expectRelativelyClose(design.areaMm2, 1200, exactCurveTolerance, 'inherited evenodd')
  })

  it('cuts a hole where one element lies inside another (Sheetsmith rule: every drawn contour is cut, common practice)', () => {
    const svg = millimetreDocument('<rect x="10" y="10" width="60" height="40"/><circle cx="40" cy="30" r="12"/>')

    const design = importSvg(svg)

    expect(design.holeCount).toBe(1)
    expectRelativelyClose(design.areaMm2, 2400 - Math.PI * 144, exactCurveTolerance, 'rectangle minus πr²')
    expectRelativelyClose(design.cutLengthMm, 200 + 24 * Math.PI, exactCurveTolerance, 'rectangle perimeter plus 2πr')
  })
})

describe('a regular pentagram drawn as one self-crossing path (SVG 1.1 §11.3; elementary geometry)', () => {
  // Outer vertices on a circle of radius R about (50, 50), visited every second vertex (0, 2, 4, 1, 3).
  const outerRadius = 40
  const outer = Array.from({ length: 5 }, (_, index) => {
    const angle = (2 * Math.PI * index) / 5
    return [50 + outerRadius * Math.sin(angle), 50 - outerRadius * Math.cos(angle)] as const
  })
  const pathData = `M${[0, 2, 4, 1, 3].map((index) => `${outer[index]![0]} ${outer[index]![1]}`).join(' L')} Z`

  // The crossings form the inner pentagon, circumradius r = R·cos 72° / cos 36°.
  const innerRadius = (outerRadius * Math.cos((2 * Math.PI) / 5)) / Math.cos(Math.PI / 5)
  // The filled star is a decagon with alternating radii R and r: ten triangles ½·R·r·sin 36°.
  const starAreaMm2 = 5 * outerRadius * innerRadius * Math.sin(Math.PI / 5)
  // Regular pentagon of circumradius r: (5/2)·r²·sin 72°.
  const pentagonAreaMm2 = 2.5 * innerRadius * innerRadius * Math.sin((2 * Math.PI) / 5)
  // Star edge: outer vertex to neighbouring inner vertex (law of cosines); inner pentagon side 2r·sin 36°.
  const starEdgeMm = Math.sqrt(outerRadius ** 2 + innerRadius ** 2 - 2 * outerRadius * innerRadius * Math.cos(Math.PI / 5))
  const pentagonSideMm = 2 * innerRadius * Math.sin(Math.PI / 5)
  // The crossings are resolved on the 1 µm grid: each corner moves by at most 0.71 µm, so the area by at most
  // that times the perimeter; we allow 1 µm × perimeter, and 1 µm per corner on lengths.
  const gridMm = 1e-3

  it('fills the centre pentagon under nonzero (winding number 2 there)', () => {
    const svg = millimetreDocument(`<path fill-rule="nonzero" d="${pathData}"/>`)

    const design = importSvg(svg)

    expectAbsolutelyClose(design.areaMm2, starAreaMm2, gridMm * 10 * starEdgeMm, 'nonzero pentagram area = star')
    expectAbsolutelyClose(design.cutLengthMm, 10 * starEdgeMm, gridMm * 10, 'nonzero pentagram outline = 10 star edges')
    expect(design.holeCount).toBe(0)
  })

  it('leaves the centre pentagon empty under evenodd', () => {
    const svg = millimetreDocument(`<path fill-rule="evenodd" d="${pathData}"/>`)

    const design = importSvg(svg)

    const perimeterMm = 10 * starEdgeMm + 5 * pentagonSideMm
    expectAbsolutelyClose(design.areaMm2, starAreaMm2 - pentagonAreaMm2, gridMm * perimeterMm, 'evenodd pentagram area = star − pentagon')
    expectAbsolutelyClose(design.cutLengthMm, perimeterMm, gridMm * 15, 'evenodd pentagram cut = the five chords')
  })
})

describe('open paths, hidden elements and styles', () => {
  it('turns an open path into a cut line with no area', () => {
    const svg = millimetreDocument('<path d="M10 10 H50 V50" fill="none" stroke="black"/>')

    const design = importSvg(svg)

    expect(design.pieces).toHaveLength(0)
    expect(design.cutLines).toHaveLength(1)
    expect(design.areaMm2).toBe(0)
    expectRelativelyClose(design.cutLengthMm, 40 + 40, exactCurveTolerance, 'open path length')
  })

  it('skips display:none (itself and descendants) and visibility:hidden, but draws a visible child of a hidden group', () => {
    // SVG 1.1 §11.5: display none renders nothing below it; visibility is inherited and a child may set it back to visible.
    const svg = millimetreDocument(`<rect x="10" y="10" width="10" height="10"/>
      <rect display="none" x="50" y="50" width="10" height="10"/>
      <g style="display:none"><rect x="60" y="60" width="10" height="10"/></g>
      <rect visibility="hidden" x="70" y="70" width="10" height="10"/>
      <g visibility="hidden"><rect x="80" y="80" width="5" height="5"/><rect visibility="visible" x="30" y="30" width="5" height="5"/></g>`)

    const design = importSvg(svg)

    expect(design.pieces).toHaveLength(2)
    expectRelativelyClose(design.areaMm2, 100 + 25, exactCurveTolerance, 'visible rectangles only')
    expectBoxClose(design.bbox, box(10, 10, 35, 35), 1e-3, 'visible rectangles only')
  })

  it('lets the style attribute override a presentation attribute (evenodd attribute, nonzero style → no hole)', () => {
    // SVG 1.1 §6.4: presentation attributes have specificity 0 and lose to any other style rule, including style="…".
    const svg = millimetreDocument('<path fill-rule="evenodd" style="fill-rule: nonzero" d="M10 10 H50 V50 H10 Z M20 20 H40 V40 H20 Z"/>')

    const design = importSvg(svg)

    expect(design.holeCount).toBe(0)
    expectRelativelyClose(design.areaMm2, 1600, exactCurveTolerance, 'style nonzero wins')
  })

  it('lets the style attribute override a presentation attribute (nonzero attribute, evenodd style → hole)', () => {
    const svg = millimetreDocument('<path fill-rule="nonzero" style="fill-rule:evenodd" d="M10 10 H50 V50 H10 Z M20 20 H40 V40 H20 Z"/>')

    const design = importSvg(svg)

    expect(design.holeCount).toBe(1)
    expectRelativelyClose(design.areaMm2, 1200, exactCurveTolerance, 'style evenodd wins')
  })

  it('lets a style sheet class rule override a presentation attribute, and style="" override the class', () => {
    // SVG 1.1 §6.4 (presentation attributes lose to style sheets); CSS 2.1 §6.4.3 (the style attribute is most specific).
    const svg = millimetreDocument(`<style>.holes { fill-rule: evenodd } .hidden { display: none }</style>
      <path class="holes" fill-rule="nonzero" d="M10 10 H50 V50 H10 Z M20 20 H40 V40 H20 Z"/>
      <rect class="hidden" style="display: inline" x="60" y="60" width="10" height="10"/>`)

    const design = importSvg(svg)

    expectRelativelyClose(design.areaMm2, 1200 + 100, exactCurveTolerance, 'class evenodd applied; inline display wins over class')
  })

  it('reports text, images, foreignObject and clip-path as warnings and cuts only the outlines', () => {
    const svg = millimetreDocument(`<defs><clipPath id="clip"><rect width="5" height="5"/></clipPath></defs>
      <rect x="10" y="10" width="10" height="10" clip-path="url(#clip)"/>
      <text x="10" y="50">Name</text>
      <image href="photo.png" x="50" y="50" width="20" height="20"/>
      <foreignObject x="0" y="60" width="20" height="20"><div xmlns="http://www.w3.org/1999/xhtml">x</div></foreignObject>`)

    const design = importSvg(svg)

    const codes = design.warnings.map((warning) => warning.code).sort()
    expect(codes).toEqual(['foreign_object', 'image', 'text', 'unsupported_clip-path'])
    // The clip is not applied: the full 10 × 10 outline is cut.
    expectRelativelyClose(design.areaMm2, 100, exactCurveTolerance, 'only the rectangle')
  })
})

describe('small pieces', () => {
  it('measures a 1 mm square that sits off the 1 µm grid on its own outline, without a "resolved outline" warning', () => {
    // Nothing crosses or overlaps here, so the exact outline should be used: area s², perimeter 4s (elementary geometry).
    const side = 1.0003
    const svg = millimetreDocument(`<rect x="10.0004" y="10.0004" width="${side}" height="${side}"/>`)

    const design = importSvg(svg, { minSpeckAreaMm2: 0 })

    expectRelativelyClose(design.areaMm2, side * side, exactCurveTolerance, 'area s²')
    expectRelativelyClose(design.cutLengthMm, 4 * side, exactCurveTolerance, 'perimeter 4s')
    expect(design.warnings.map((warning) => warning.code)).not.toContain('resolved_outline')
  })
})
