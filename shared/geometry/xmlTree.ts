import { XMLParser, XMLValidator } from 'fast-xml-parser'

export interface XmlElement {
  name: string
  attributes: Record<string, string>
  children: XmlElement[]
  /** Text directly inside the element (for <style>). */
  text: string
}

export class SvgReadError extends Error {
  constructor(
    readonly code: 'not_svg' | 'malformed_xml' | 'doctype' | 'empty' | 'bad_size' | 'too_complex',
    message: string,
  ) {
    super(message)
    this.name = 'SvgReadError'
  }
}

const parser = new XMLParser({
  preserveOrder: true,
  ignoreAttributes: false,
  attributeNamePrefix: '',
  // Entities are never expanded: no internal entity bombs, no external entities.
  processEntities: false,
  htmlEntities: false,
  parseAttributeValue: false,
  parseTagValue: false,
  trimValues: false,
  allowBooleanAttributes: true,
  // Style sheets are often wrapped in CDATA; its text belongs to the element like any other text.
  cdataPropName: '#cdata',
})

type RawNode = Record<string, unknown> & { ':@'?: Record<string, string> }

function toElement(node: RawNode): XmlElement | undefined {
  const name = Object.keys(node).find((key) => key !== ':@')
  if (!name || name.startsWith('#') || name.startsWith('?')) return undefined
  const rawChildren = (node[name] as RawNode[] | undefined) ?? []
  const children: XmlElement[] = []
  let text = ''
  for (const child of rawChildren) {
    if ('#text' in child) text += String(child['#text'])
    else if ('#cdata' in child) text += (child['#cdata'] as { '#text'?: unknown }[]).map((part) => String(part['#text'] ?? '')).join('')
    else {
      const element = toElement(child)
      if (element) children.push(element)
    }
  }
  // Namespaced names (svg:path) are read by their local name.
  const localName = name.includes(':') ? name.slice(name.indexOf(':') + 1) : name
  return { name: localName, attributes: { ...(node[':@'] ?? {}) }, children, text }
}

/**
 * Parses SVG text into a plain element tree. Refuses DOCTYPE and ENTITY declarations outright
 * (entity-expansion bombs, external entities) and anything that is not well-formed XML with an <svg> root.
 */
export function parseSvgXml(text: string): XmlElement {
  if (!text.trim()) throw new SvgReadError('empty', 'The file is empty')
  if (/<!DOCTYPE/i.test(text) || /<!ENTITY/i.test(text)) {
    throw new SvgReadError('doctype', 'The file declares a DOCTYPE or ENTITY; for safety such files are refused. Save it again as plain SVG.')
  }
  const validation = XMLValidator.validate(text, { allowBooleanAttributes: true })
  if (validation !== true) {
    throw new SvgReadError('malformed_xml', `The file is not well-formed XML (line ${validation.err.line}: ${validation.err.msg})`)
  }
  const nodes = parser.parse(text) as RawNode[]
  const roots = nodes.map(toElement).filter((element): element is XmlElement => element !== undefined)
  const root = roots[0]
  if (!root || root.name !== 'svg') throw new SvgReadError('not_svg', 'The file is XML but not SVG: its root element is not <svg>')
  return root
}
