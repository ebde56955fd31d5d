import { Resvg } from '@resvg/resvg-js'
import { describe, expect, it } from 'vitest'
import { importSvg } from '../../shared/geometry/importSvg.js'
import { expectRelativelyClose, millimetreDocument, svgNamespace } from './referenceChecks.js'

/**
 * Reference: pixel coverage of the same design rendered by resvg, an independent SVG rasteriser, at a known scale.
 * Black fill (the SVG initial fill), no stroke, white background, anti-aliased (shape-rendering auto): each pixel's
 * darkness / 255 is the fraction of it the shapes cover, so the sum over pixels is the area in px².
 * Edge anti-aliasing and the rasteriser's curve flattening limit agreement; 1 % is required.
 */
const pixelsPerMm = 10
const relativeTolerance = 0.01

/**
 * Renders fitted to the document's width in mm × px/mm (resvg sizes documents at 96 px per inch, CSS Values 3),
 * and sums the coverage. Returns the covered area in mm² and the image size in px.
 */
function renderWithResvg(svg: string, widthMm: number): { coveredMm2: number; widthPx: number; heightPx: number } {
  const renderer = new Resvg(svg, { fitTo: { mode: 'width', value: Math.round(widthMm * pixelsPerMm) }, background: 'white', shapeRendering: 2 })
  const image = renderer.render()
  const pixels = image.pixels
  let coveredPixels = 0
  for (let index = 0; index < pixels.length; index += 4) coveredPixels += (255 - pixels[index]!) / 255
  return { coveredMm2: coveredPixels / (pixelsPerMm * pixelsPerMm), widthPx: image.width, heightPx: image.height }
}

// A regular pentagram of outer radius 38 about (50, 50), vertices visited every second one.
const pentagramPath = (() => {
  const vertices = Array.from({ length: 5 }, (_, index) => [50 + 38 * Math.sin((4 * Math.PI * index) / 5), 50 - 38 * Math.cos((4 * Math.PI * index) / 5)])
  return `M${vertices.map(([x, y]) => `${x} ${y}`).join(' L')} Z`
})()

interface Design {
  name: string
  /** What Sheetsmith imports. */
  svg: string
  /** What resvg renders, when the same file would mean something else to a renderer. */
  renderedSvg?: string
  widthMm: number
  heightMm: number
  holes: number
}

const designs: Design[] = [
  {
    // Outline clockwise, three holes anticlockwise in one path: nonzero leaves the holes empty (SVG 1.1 §11.3).
    name: 'a circle with three round holes (nonzero, holes drawn the other way round)',
    svg: millimetreDocument(`<path d="M10 50 A40 40 0 1 1 90 50 A40 40 0 1 1 10 50 Z
      M42 30 A8 8 0 1 0 58 30 A8 8 0 1 0 42 30 Z
      M24 62 A9 9 0 1 0 42 62 A9 9 0 1 0 24 62 Z
      M60 62 A7 11 30 1 0 74 62 A7 11 30 1 0 60 62 Z"/>`),
    widthMm: 100,
    heightMm: 100,
    holes: 3,
  },
  {
    name: 'rounded rectangles with rx/ry and with rx only',
    svg: millimetreDocument('<rect x="8" y="8" width="84" height="40" rx="15" ry="8"/><rect x="20" y="58" width="60" height="34" rx="12"/>'),
    widthMm: 100,
    heightMm: 100,
    holes: 0,
  },
  {
    name: 'a pentagram under evenodd (empty centre)',
    svg: millimetreDocument(`<path fill-rule="evenodd" d="${pentagramPath}"/>`),
    widthMm: 100,
    heightMm: 100,
    holes: 0,
  },
  {
    name: 'a pentagram under nonzero (filled centre)',
    svg: millimetreDocument(`<path fill-rule="nonzero" d="${pentagramPath}"/>`),
    widthMm: 100,
    heightMm: 100,
    holes: 0,
  },
  {
    name: 'nested groups with rotate, scale, skewX and matrix',
    svg: millimetreDocument(`<g transform="translate(32 32) rotate(25)"><g transform="scale(1.5 0.8) skewX(20)"><rect x="-12" y="-15" width="24" height="30"/></g></g>
      <g transform="matrix(0.8 0.3 -0.2 1.1 75 78)"><ellipse cx="0" cy="0" rx="15" ry="9"/></g>`),
    widthMm: 100,
    heightMm: 100,
    holes: 0,
  },
  {
    name: 'a blob of cubic and quadratic curves (C, S, Q, T)',
    svg: millimetreDocument('<path d="M20 50 C20 20 45 10 60 20 S90 40 80 60 Q70 85 45 80 T20 50 Z"/>'),
    widthMm: 100,
    heightMm: 100,
    holes: 0,
  },
  {
    name: 'a closed outline of rotated elliptical arcs',
    svg: millimetreDocument('<path d="M20 60 A30 15 -30 0 1 70 30 A20 20 0 0 1 80 70 A40 25 20 0 1 20 60 Z"/>'),
    widthMm: 100,
    heightMm: 100,
    holes: 0,
  },
  {
    // Sheetsmith's rule: a contour inside another element cuts a hole (every drawn contour is cut; common practice).
    // A renderer would paint the circle and ellipse over the rectangle, so resvg gets the same meaning written as
    // one path with fill-rule evenodd: the rectangle, circle and ellipse outlines merged.
    name: 'holes drawn as separate elements inside a rectangle',
    svg: millimetreDocument('<rect x="10" y="10" width="80" height="60"/><circle cx="38" cy="40" r="15"/><ellipse cx="72" cy="42" rx="10" ry="18"/>'),
    renderedSvg: millimetreDocument(`<path fill-rule="evenodd" d="M10 10 H90 V70 H10 Z
      M23 40 A15 15 0 1 1 53 40 A15 15 0 1 1 23 40 Z
      M62 42 A10 18 0 1 1 82 42 A10 18 0 1 1 62 42 Z"/>`),
    widthMm: 100,
    heightMm: 100,
    holes: 2,
  },
  {
    // 4 in × 3 in with a 400 × 300 viewBox: one user unit is 0.01 in = 0.254 mm (CSS Values 3: 1 in = 25.4 mm).
    name: 'shapes in a document sized in inches with a viewBox',
    svg: `<svg ${svgNamespace} width="4in" height="3in" viewBox="0 0 400 300">
      <polygon points="20,20 180,40 120,150"/><circle cx="280" cy="100" r="60"/><rect x="40" y="180" width="300" height="90" rx="20"/></svg>`,
    widthMm: 101.6,
    heightMm: 76.2,
    holes: 0,
  },
]

describe('area against pixel coverage rendered by resvg at 10 px per mm', () => {
  for (const design of designs) {
    it(`agrees within 1 % for ${design.name}`, () => {
      const imported = importSvg(design.svg)
      const rendered = renderWithResvg(design.renderedSvg ?? design.svg, design.widthMm)

      // The scale is right only if the image is the document's size in mm times px per mm, and our document is that
      // size too; the hole count guards that both read the same meaning.
      expect([rendered.widthPx, rendered.heightPx]).toEqual([Math.round(design.widthMm * pixelsPerMm), Math.round(design.heightMm * pixelsPerMm)])
      expectRelativelyClose(imported.widthMm, design.widthMm, 1e-12, 'document width')
      expectRelativelyClose(imported.heightMm, design.heightMm, 1e-12, 'document height')
      expect(imported.holeCount).toBe(design.holes)
      expectRelativelyClose(imported.areaMm2, rendered.coveredMm2, relativeTolerance, `${design.name}: our area vs resvg coverage (mm²)`)
    })
  }
})
