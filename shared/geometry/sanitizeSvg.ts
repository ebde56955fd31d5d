import { XMLBuilder, XMLParser } from 'fast-xml-parser'

const parser = new XMLParser({
  preserveOrder: true,
  ignoreAttributes: false,
  attributeNamePrefix: '@_',
  processEntities: false,
  htmlEntities: false,
  parseAttributeValue: false,
  parseTagValue: false,
  trimValues: false,
  allowBooleanAttributes: true,
  commentPropName: '#comment',
  // CDATA stays CDATA on the way out: its text must never come back as markup.
  cdataPropName: '#cdata',
})
const builder = new XMLBuilder({
  preserveOrder: true,
  ignoreAttributes: false,
  attributeNamePrefix: '@_',
  processEntities: false,
  suppressEmptyNode: true,
  commentPropName: '#comment',
  cdataPropName: '#cdata',
})

// Animation elements can rewrite attributes (href included) after loading; a cut file needs none of them.
const droppedElements = new Set(['script', 'foreignObject', 'iframe', 'embed', 'object', 'audio', 'video', 'handler', 'listener', 'animate', 'set', 'animateMotion', 'animateTransform'])

/** Style sheet text without imports or references to anything outside the file. */
function cleanCss(css: string): string {
  return css.replace(/@import[^;]*;?/gi, '').replace(/url\(\s*(['"]?)(?!#)[^)]*\)/gi, 'none').replace(/expression\s*\(/gi, '(')
}

type Node = Record<string, unknown> & { ':@'?: Record<string, string> }

function localName(name: string) {
  return name.includes(':') ? name.slice(name.indexOf(':') + 1) : name
}

function cleanNodes(nodes: Node[]): Node[] {
  const kept: Node[] = []
  for (const node of nodes) {
    const name = Object.keys(node).find((key) => key !== ':@')
    if (!name) continue
    if (name === '?xml' || name === '#comment') {
      kept.push(node)
      continue
    }
    if (name === '#text') {
      kept.push({ '#text': cleanCss(String(node['#text'])) })
      continue
    }
    if (name === '#cdata') {
      const parts = (node['#cdata'] as { '#text'?: unknown }[]).map((part) => ({ '#text': cleanCss(String(part['#text'] ?? '')) }))
      kept.push({ '#cdata': parts })
      continue
    }
    if (droppedElements.has(localName(name))) continue
    const attributes = { ...(node[':@'] ?? {}) }
    for (const key of Object.keys(attributes)) {
      const attribute = localName(key.slice(2)).toLowerCase()
      const value = String(attributes[key]).trim().toLowerCase()
      const external = (attribute === 'href' || attribute === 'src') && !value.startsWith('#') && !value.startsWith('data:image/png') && !value.startsWith('data:image/jpeg')
      if (attribute.startsWith('on') || external || value.startsWith('javascript:')) delete attributes[key]
      else if (attribute === 'style' || /url\(/i.test(value)) attributes[key] = cleanCss(String(attributes[key]))
    }
    const children = Array.isArray(node[name]) ? cleanNodes(node[name] as Node[]) : []
    const cleaned: Node = { [name]: children }
    if (Object.keys(attributes).length > 0) cleaned[':@'] = attributes
    kept.push(cleaned)
  }
  return kept
}

/**
 * The uploaded SVG without what could act on a viewer's machine: scripts, event attributes, embedded
 * foreign content and references to anything outside the file. Kept for download, never rendered by us.
 * Call only on text that `parseSvgXml` accepted (well-formed, no DOCTYPE).
 */
export function sanitizeSvg(text: string): string {
  return builder.build(cleanNodes(parser.parse(text) as Node[])) as string
}
