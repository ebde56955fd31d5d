import { arcToSegment, ellipseContour, transformSegment, type Contour, type Segment } from './curves.js'
import { MM_PER_PX, parseLength, parseUserLength } from './lengths.js'
import { determinant, identity, multiply, parseTransform, scaling, translation, TransformSyntaxError, type Matrix } from './matrix.js'
import { parsePathData } from './pathData.js'
import { parseSvgXml, SvgReadError, type XmlElement } from './xmlTree.js'

export type FillRule = 'nonzero' | 'evenodd'

/** One drawn element's geometry, in millimetres of the design, with the fill rule that decides its holes. */
export interface DrawnShape {
  contours: Contour[]
  fillRule: FillRule
  label: string
}

export interface ReadWarning {
  code: string
  message: string
  count: number
}

export interface SvgDrawing {
  widthMm: number
  heightMm: number
  shapes: DrawnShape[]
  warnings: ReadWarning[]
}

interface Style {
  display: string
  visibility: string
  fillRule: FillRule
  stroke: string
  strokeWidth: string
}

interface Viewport {
  widthUser: number
  heightUser: number
}

const maxShapes = 50_000

const inheritedDefaults: Style = { display: 'inline', visibility: 'visible', fillRule: 'nonzero', stroke: 'none', strokeWidth: '1' }

/** Elements that never draw by themselves, or are used only through references. */
const containerOnly = new Set(['defs', 'symbol', 'clipPath', 'mask', 'pattern', 'marker', 'linearGradient', 'radialGradient', 'filter', 'metadata', 'title', 'desc', 'style', 'script'])
const textElements = new Set(['text', 'tspan', 'textPath'])
const shapeElements = new Set(['path', 'rect', 'circle', 'ellipse', 'line', 'polyline', 'polygon'])

class WarningLog {
  private readonly byCode = new Map<string, ReadWarning>()
  add(code: string, message: string) {
    const existing = this.byCode.get(code)
    if (existing) existing.count += 1
    else this.byCode.set(code, { code, message, count: 1 })
  }
  list(): ReadWarning[] {
    return [...this.byCode.values()]
  }
}

/** Declarations of a `style` attribute or a CSS rule body. */
function parseDeclarations(text: string | undefined): Record<string, string> {
  const result: Record<string, string> = {}
  if (!text) return result
  for (const declaration of text.split(';')) {
    const colon = declaration.indexOf(':')
    if (colon < 0) continue
    const name = declaration.slice(0, colon).trim().toLowerCase()
    const value = declaration
      .slice(colon + 1)
      .replace(/!important/i, '')
      .trim()
    if (name) result[name] = value
  }
  return result
}

/** Simple class and id rules of <style> elements (`.a, .b { … }`, `#x { … }`); other selectors are reported, not applied. */
function collectStyleRules(root: XmlElement, warnings: WarningLog): Map<string, Record<string, string>> {
  const rules = new Map<string, Record<string, string>>()
  const visit = (element: XmlElement) => {
    if (element.name === 'style') {
      const css = element.text.replace(/\/\*[\s\S]*?\*\//g, '')
      for (const match of css.matchAll(/([^{}]+)\{([^}]*)\}/g)) {
        const declarations = parseDeclarations(match[2])
        for (const rawSelector of match[1]!.split(',')) {
          const selector = rawSelector.trim()
          if (/^[.#][\w-]+$/.test(selector)) rules.set(selector, { ...(rules.get(selector) ?? {}), ...declarations })
          else if (selector) warnings.add('css_selector', `A style sheet rule with selector "${selector}" was not applied; class and id rules were`)
        }
      }
    }
    element.children.forEach(visit)
  }
  visit(root)
  return rules
}

interface WalkState {
  matrix: Matrix
  style: Style
  viewport: Viewport
  useStack: string[]
}

/**
 * Reads an SVG document into drawn shapes in millimetres: units and viewBox resolved, every transform applied,
 * hidden elements skipped, and everything it cannot cut reported as a warning.
 * Throws SvgReadError for input that is not a usable SVG.
 */
export function readSvgDrawing(text: string): SvgDrawing {
  const root = parseSvgXml(text)
  const warnings = new WarningLog()
  const styleRules = collectStyleRules(root, warnings)
  const byId = new Map<string, XmlElement>()
  const index = (element: XmlElement) => {
    if (element.attributes.id) byId.set(element.attributes.id, element)
    element.children.forEach(index)
  }
  index(root)

  const viewBox = parseViewBox(root.attributes.viewBox)
  const widthLength = parseLength(root.attributes.width)
  const heightLength = parseLength(root.attributes.height)
  if (widthLength?.kind === 'absolute' && widthLength.mm <= 0) throw new SvgReadError('bad_size', 'The SVG width is zero or negative')
  if (heightLength?.kind === 'absolute' && heightLength.mm <= 0) throw new SvgReadError('bad_size', 'The SVG height is zero or negative')
  if ((widthLength?.kind === 'percent' || heightLength?.kind === 'percent') && viewBox) {
    warnings.add('percent_size', 'The SVG size is a percentage; the viewBox size was read as CSS px (96 per inch)')
  }
  let widthUser = widthLength?.kind === 'absolute' ? widthLength.mm / MM_PER_PX : undefined
  let heightUser = heightLength?.kind === 'absolute' ? heightLength.mm / MM_PER_PX : undefined
  // One side given with a viewBox: the other follows the viewBox's aspect ratio, as browsers size an SVG image
  // (CSS 2.1 §10.6.2, intrinsic ratio).
  if (viewBox && widthUser !== undefined && heightUser === undefined) heightUser = (widthUser * viewBox[3]) / viewBox[2]
  if (viewBox && heightUser !== undefined && widthUser === undefined) widthUser = (heightUser * viewBox[2]) / viewBox[3]
  widthUser ??= viewBox?.[2] ?? 0
  heightUser ??= viewBox?.[3] ?? 0
  if (!widthLength && !heightLength && !viewBox) warnings.add('no_size', 'The SVG gives no size or viewBox; coordinates were read as CSS px (96 per inch)')

  const rootMatrix = multiply(scaling(MM_PER_PX), viewBox ? viewportTransform(viewBox, widthUser, heightUser, root.attributes.preserveAspectRatio) : identity)
  const shapes: DrawnShape[] = []

  const styleOf = (element: XmlElement, inherited: Style): { style: Style; own: Record<string, string> } => {
    const own: Record<string, string> = {}
    for (const name of ['display', 'visibility', 'fill-rule', 'stroke', 'stroke-width', 'clip-path', 'mask', 'filter']) {
      if (element.attributes[name] !== undefined) own[name] = element.attributes[name]!
    }
    for (const className of (element.attributes.class ?? '').split(/\s+/).filter(Boolean)) Object.assign(own, styleRules.get(`.${className}`))
    if (element.attributes.id) Object.assign(own, styleRules.get(`#${element.attributes.id}`))
    Object.assign(own, parseDeclarations(element.attributes.style))
    const pick = (name: string, fallback: string) => {
      const value = own[name]
      return value === undefined || value === 'inherit' ? fallback : value
    }
    const fillRule = pick('fill-rule', inherited.fillRule)
    return {
      own,
      style: {
        display: own.display ?? 'inline',
        visibility: pick('visibility', inherited.visibility),
        fillRule: fillRule === 'evenodd' ? 'evenodd' : 'nonzero',
        stroke: pick('stroke', inherited.stroke),
        strokeWidth: pick('stroke-width', inherited.strokeWidth),
      },
    }
  }

  const walk = (element: XmlElement, state: WalkState) => {
    if (containerOnly.has(element.name)) {
      if (element.name === 'script') warnings.add('script', 'A script was ignored')
      return
    }
    if (element.name === 'foreignObject') return warnings.add('foreign_object', 'Embedded non-SVG content (foreignObject) was ignored')
    if (element.name === 'image') return warnings.add('image', 'A bitmap image was ignored: only vector outlines are cut')
    if (textElements.has(element.name)) return warnings.add('text', 'Text is not cut: convert text to outlines first')

    const { style, own } = styleOf(element, state.style)
    if (style.display === 'none') return
    for (const [property, label] of [
      ['clip-path', 'clipping paths'],
      ['mask', 'masks'],
      ['filter', 'filters'],
    ] as const) {
      const value = own[property]
      if (value && value !== 'none') warnings.add(`unsupported_${property}`, `${label[0]!.toUpperCase()}${label.slice(1)} are not applied; the full outlines are cut`)
    }

    let matrix = state.matrix
    try {
      matrix = multiply(state.matrix, parseTransform(element.attributes.transform))
    } catch (error) {
      if (error instanceof TransformSyntaxError) {
        warnings.add('bad_transform', `An element with an unreadable transform was skipped (${error.message})`)
        return
      }
      throw error
    }
    const next: WalkState = { ...state, matrix, style }

    if (element.name === 'svg' || element.name === 'g' || element.name === 'a' || element.name === 'switch') {
      if (element.name === 'svg' && element !== root) {
        const nested = nestedViewport(element, next)
        if (!nested) return
        for (const child of element.children) walk(child, nested)
        return
      }
      for (const child of element.children) walk(child, next)
      return
    }

    if (element.name === 'use') {
      const href = element.attributes.href ?? element.attributes['xlink:href']
      if (!href) return
      if (!href.startsWith('#')) return warnings.add('external_reference', `A reference to another file (${href.slice(0, 60)}) was ignored; nothing is fetched`)
      const id = href.slice(1)
      const target = byId.get(id)
      if (!target) return warnings.add('missing_reference', `A <use> refers to #${id}, which the file does not contain`)
      if (state.useStack.includes(id)) return warnings.add('reference_loop', `A <use> of #${id} refers to itself; the loop was cut`)
      const x = parseUserLength(element.attributes.x, state.viewport.widthUser)
      const y = parseUserLength(element.attributes.y, state.viewport.heightUser)
      const placed: WalkState = { ...next, matrix: multiply(next.matrix, translation(x, y)), useStack: [...state.useStack, id] }
      if (target.name === 'symbol') {
        const symbolAsSvg: XmlElement = {
          ...target,
          name: 'svg',
          attributes: { ...target.attributes, width: element.attributes.width ?? target.attributes.width ?? '100%', height: element.attributes.height ?? target.attributes.height ?? '100%' },
        }
        const nested = nestedViewport(symbolAsSvg, placed)
        if (nested) for (const child of target.children) walk(child, nested)
        return
      }
      walk(target, placed)
      return
    }

    if (!shapeElements.has(element.name)) {
      if (element.children.length > 0) for (const child of element.children) walk(child, next)
      return
    }
    if (style.visibility === 'hidden' || style.visibility === 'collapse') return

    const contours = shapeContours(element, state.viewport, warnings)
    if (contours.length === 0) return
    // <use> can multiply shapes exponentially with nesting; a real design never comes near this.
    if (shapes.length >= maxShapes) throw new SvgReadError('too_complex', `The drawing has more than ${maxShapes.toLocaleString('en')} shapes (check for deeply repeated <use> references)`)
    if (determinant(matrix) === 0) return warnings.add('flat_transform', 'An element flattened to a line by its transform was skipped')
    const toMillimetres = multiply(rootMatrix, matrix)
    const scaleMm = Math.sqrt(Math.abs(determinant(toMillimetres)))
    if (style.stroke !== 'none' && style.stroke !== 'transparent') {
      const strokeWidthMm = parseUserLength(style.strokeWidth, state.viewport.widthUser, 1) * scaleMm
      if (strokeWidthMm > 1) {
        warnings.add('thick_stroke', 'A stroke wider than 1 mm is cut along its centre line; outline the stroke first if its width should be cut')
      }
    }
    shapes.push({
      fillRule: style.fillRule,
      label: element.attributes.id ? `${element.name}#${element.attributes.id}` : element.name,
      contours: contours.map((contour) => ({ closed: contour.closed, segments: contour.segments.map((segment) => transformSegment(segment, toMillimetres)) })),
    })
  }

  /** The state inside a nested <svg> (or a used <symbol>): its own viewport and viewBox mapping. */
  const nestedViewport = (element: XmlElement, state: WalkState): WalkState | undefined => {
    const x = parseUserLength(element.attributes.x, state.viewport.widthUser)
    const y = parseUserLength(element.attributes.y, state.viewport.heightUser)
    const width = parseUserLength(element.attributes.width ?? '100%', state.viewport.widthUser)
    const height = parseUserLength(element.attributes.height ?? '100%', state.viewport.heightUser)
    if (width <= 0 || height <= 0) return undefined
    const box = parseViewBox(element.attributes.viewBox)
    if (element.attributes.viewBox !== undefined && !box) {
      warnings.add('bad_viewbox', 'A nested viewport with an empty or unreadable viewBox was skipped')
      return undefined
    }
    let matrix = multiply(state.matrix, translation(x, y))
    if (box) matrix = multiply(matrix, viewportTransform(box, width, height, element.attributes.preserveAspectRatio))
    return { ...state, matrix, viewport: { widthUser: box?.[2] ?? width, heightUser: box?.[3] ?? height } }
  }

  if (root.attributes.viewBox !== undefined && !viewBox) {
    throw new SvgReadError('bad_size', 'The viewBox is empty, zero-sized or unreadable, so nothing in the file is drawn')
  }
  const rootStyle = styleOf(root, inheritedDefaults).style
  if (rootStyle.display === 'none') throw new SvgReadError('empty', 'The whole drawing is hidden (display: none)')
  const viewport: Viewport = { widthUser: viewBox?.[2] ?? widthUser, heightUser: viewBox?.[3] ?? heightUser }
  let rootTransform = identity
  try {
    rootTransform = parseTransform(root.attributes.transform)
  } catch {
    warnings.add('bad_transform', 'The transform of the <svg> element could not be read and was ignored')
  }
  for (const child of root.children) walk(child, { matrix: rootTransform, style: rootStyle, viewport, useStack: [] })

  return { widthMm: widthUser * MM_PER_PX, heightMm: heightUser * MM_PER_PX, shapes, warnings: warnings.list() }
}

/** viewBox="min-x min-y width height"; undefined when absent or when width or height is not positive (rendering disabled). */
function parseViewBox(text: string | undefined): [number, number, number, number] | undefined {
  if (!text) return undefined
  const values = text
    .trim()
    .split(/[\s,]+/)
    .map(Number)
  if (values.length !== 4 || values.some((value) => !Number.isFinite(value))) return undefined
  if (values[2]! <= 0 || values[3]! <= 0) return undefined
  return values as [number, number, number, number]
}

/** The viewBox to viewport mapping of W3C SVG 1.1 §7.7 / §7.8 (preserveAspectRatio: align, meet or slice, or none). */
export function viewportTransform(box: [number, number, number, number], width: number, height: number, preserveAspectRatio: string | undefined): Matrix {
  const [minX, minY, boxWidth, boxHeight] = box
  const [alignRaw, meetOrSliceRaw] = (preserveAspectRatio ?? 'xMidYMid meet').trim().split(/\s+/)
  const align = alignRaw === 'defer' ? (meetOrSliceRaw ?? 'xMidYMid') : (alignRaw ?? 'xMidYMid')
  const scaleX = width / boxWidth
  const scaleY = height / boxHeight
  if (align === 'none') return multiply(scaling(scaleX, scaleY), translation(-minX, -minY))
  const slice = (alignRaw === 'defer' ? preserveAspectRatio?.split(/\s+/)[2] : meetOrSliceRaw) === 'slice'
  const scale = slice ? Math.max(scaleX, scaleY) : Math.min(scaleX, scaleY)
  const freeX = width - boxWidth * scale
  const freeY = height - boxHeight * scale
  const offsetX = align.startsWith('xMid') ? freeX / 2 : align.startsWith('xMax') ? freeX : 0
  const offsetY = align.endsWith('YMid') ? freeY / 2 : align.endsWith('YMax') ? freeY : 0
  return multiply(translation(offsetX, offsetY), multiply(scaling(scale), translation(-minX, -minY)))
}

function readPoints(text: string | undefined, warnings: WarningLog): [number, number][] {
  const numbers = (text ?? '')
    .trim()
    .split(/[\s,]+/)
    .filter(Boolean)
    .map(Number)
  const points: [number, number][] = []
  for (let index = 0; index + 1 < numbers.length; index += 2) {
    const x = numbers[index]!
    const y = numbers[index + 1]!
    if (!Number.isFinite(x) || !Number.isFinite(y)) {
      warnings.add('bad_number', 'A coordinate that is not a finite number ended a shape early')
      break
    }
    points.push([x, y])
  }
  if (numbers.length % 2 === 1) warnings.add('odd_points', 'A points list with an odd count of numbers lost its last number')
  return points
}

function polylineContour(points: [number, number][], closed: boolean): Contour[] {
  if (points.length < 2) return []
  const segments: Segment[] = []
  for (let index = 1; index < points.length; index++) segments.push({ kind: 'line', from: points[index - 1]!, to: points[index]! })
  const first = points[0]!
  const last = points[points.length - 1]!
  if (closed && (first[0] !== last[0] || first[1] !== last[1])) segments.push({ kind: 'line', from: last, to: first })
  return [{ segments, closed }]
}

/** The element's own geometry in its user units (before transforms). */
function shapeContours(element: XmlElement, viewport: Viewport, warnings: WarningLog): Contour[] {
  const attribute = element.attributes
  const diagonal = Math.sqrt((viewport.widthUser ** 2 + viewport.heightUser ** 2) / 2)
  const length = (name: string, reference: number) => parseUserLength(attribute[name], reference)
  const finite = (...values: number[]) => {
    if (values.every(Number.isFinite)) return true
    warnings.add('bad_number', 'A shape with a coordinate that is not a finite number was skipped')
    return false
  }
  switch (element.name) {
    case 'path': {
      const parsed = parsePathData(attribute.d ?? '')
      if (parsed.error) warnings.add('path_error', `Path data with an error was read up to the error (${parsed.error})`)
      return parsed.contours
    }
    case 'rect': {
      const x = length('x', viewport.widthUser)
      const y = length('y', viewport.heightUser)
      const width = length('width', viewport.widthUser)
      const height = length('height', viewport.heightUser)
      if (!finite(x, y, width, height) || width <= 0 || height <= 0) return []
      // rx/ry: one given means both (SVG 1.1 §9.2), each clamped to half the side.
      let rx = attribute.rx !== undefined ? Math.abs(length('rx', viewport.widthUser)) : undefined
      let ry = attribute.ry !== undefined ? Math.abs(length('ry', viewport.heightUser)) : undefined
      rx ??= ry ?? 0
      ry ??= rx
      rx = Math.min(rx, width / 2)
      ry = Math.min(ry, height / 2)
      if (rx === 0 || ry === 0) {
        return polylineContour(
          [
            [x, y],
            [x + width, y],
            [x + width, y + height],
            [x, y + height],
          ],
          true,
        )
      }
      const segments: Segment[] = []
      const line = (x1: number, y1: number, x2: number, y2: number) => {
        if (x1 !== x2 || y1 !== y2) segments.push({ kind: 'line', from: [x1, y1], to: [x2, y2] })
      }
      const arc = (x1: number, y1: number, x2: number, y2: number) => {
        const segment = arcToSegment(x1, y1, rx!, ry!, 0, false, true, x2, y2)
        if (segment) segments.push(segment)
      }
      line(x + rx, y, x + width - rx, y)
      arc(x + width - rx, y, x + width, y + ry)
      line(x + width, y + ry, x + width, y + height - ry)
      arc(x + width, y + height - ry, x + width - rx, y + height)
      line(x + width - rx, y + height, x + rx, y + height)
      arc(x + rx, y + height, x, y + height - ry)
      line(x, y + height - ry, x, y + ry)
      arc(x, y + ry, x + rx, y)
      return [{ segments, closed: true }]
    }
    case 'circle': {
      const cx = length('cx', viewport.widthUser)
      const cy = length('cy', viewport.heightUser)
      const r = length('r', diagonal)
      if (!finite(cx, cy, r) || r <= 0) return []
      return [ellipseContour(cx, cy, r, r)]
    }
    case 'ellipse': {
      const cx = length('cx', viewport.widthUser)
      const cy = length('cy', viewport.heightUser)
      let rx = attribute.rx !== undefined && attribute.rx !== 'auto' ? length('rx', viewport.widthUser) : undefined
      let ry = attribute.ry !== undefined && attribute.ry !== 'auto' ? length('ry', viewport.heightUser) : undefined
      rx ??= ry
      ry ??= rx
      if (rx === undefined || ry === undefined || !finite(cx, cy, rx, ry) || rx <= 0 || ry <= 0) return []
      return [ellipseContour(cx, cy, rx, ry)]
    }
    case 'line': {
      const values = [length('x1', viewport.widthUser), length('y1', viewport.heightUser), length('x2', viewport.widthUser), length('y2', viewport.heightUser)] as const
      if (!finite(...values)) return []
      return polylineContour(
        [
          [values[0], values[1]],
          [values[2], values[3]],
        ],
        false,
      )
    }
    case 'polyline':
    case 'polygon':
      return polylineContour(readPoints(attribute.points, warnings), element.name === 'polygon')
    default:
      return []
  }
}
