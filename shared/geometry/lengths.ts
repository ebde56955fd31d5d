/**
 * CSS absolute lengths as SVG uses them, in millimetres. Source: W3C CSS Values and Units Level 3,
 * "Absolute lengths": 1in = 2.54cm = 25.4mm = 96px, 1pt = 1/72in, 1pc = 1/6in, 1Q = 1/40cm.
 * SVG user units are CSS px (W3C SVG 1.1 §7.10).
 */
export const MM_PER_PX = 25.4 / 96

export const mmPerUnit: Record<string, number> = {
  px: MM_PER_PX,
  in: 25.4,
  cm: 10,
  mm: 1,
  pt: 25.4 / 72,
  pc: 25.4 / 6,
  q: 0.25,
}

export type ParsedLength = { kind: 'absolute'; mm: number } | { kind: 'percent'; fraction: number }

const lengthPattern = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(px|in|cm|mm|pt|pc|q|%)?\s*$/i

/** Reads "10mm", "2.5in", "300", "50%". Returns undefined for anything else (em, ex, garbage). */
export function parseLength(text: string | undefined): ParsedLength | undefined {
  if (text === undefined) return undefined
  const match = lengthPattern.exec(text)
  if (!match) return undefined
  const value = Number(match[1])
  if (!Number.isFinite(value)) return undefined
  const unit = (match[2] ?? 'px').toLowerCase()
  if (unit === '%') return { kind: 'percent', fraction: value / 100 }
  return { kind: 'absolute', mm: value * mmPerUnit[unit]! }
}

/** A coordinate attribute in user units (px), resolving % against a reference length in user units. */
export function parseUserLength(text: string | undefined, referenceUserUnits: number, fallback = 0): number {
  const parsed = parseLength(text)
  if (!parsed) return fallback
  if (parsed.kind === 'percent') return parsed.fraction * referenceUserUnits
  return parsed.mm / MM_PER_PX
}
