/**
 * US paper basis weight: the weight in pounds of one ream (500 sheets) of the grade's basis size.
 * Cover stock is weighed at 20 × 26 in, text (book) paper at 25 × 38 in (common practice of the US paper trade,
 * as quoted in ../shared/REFERENCES.md "Paper weights"). 1 lb = 453.59237 g exactly (international avoirdupois
 * pound); 1 in = 25.4 mm exactly, so 1 in² = 0.00064516 m².
 */
export const GRAMS_PER_POUND = 453.59237
export const SQUARE_METRES_PER_SQUARE_INCH = 0.0254 * 0.0254
export const SHEETS_PER_REAM = 500

export const basisWeightKinds = ['cover', 'text'] as const
export type BasisWeightKind = (typeof basisWeightKinds)[number]

/** Basis sheet size in inches of each grade. */
export const basisSheetInches: Record<BasisWeightKind, { widthIn: number; heightIn: number }> = {
  cover: { widthIn: 20, heightIn: 26 },
  text: { widthIn: 25, heightIn: 38 },
}

/** Area of one ream of the grade's basis sheets in m². */
export function reamAreaM2(kind: BasisWeightKind): number {
  const { widthIn, heightIn } = basisSheetInches[kind]
  return SHEETS_PER_REAM * widthIn * heightIn * SQUARE_METRES_PER_SQUARE_INCH
}

/** Grams per square metre of a paper whose basis weight is `pounds` lb of the given grade (65 lb cover ≈ 176 g/m²). */
export function gsmFromBasisWeight(pounds: number, kind: BasisWeightKind = 'cover'): number {
  return (pounds * GRAMS_PER_POUND) / reamAreaM2(kind)
}

/** The inverse: the basis weight in lb of the given grade that a paper of `gsm` g/m² has. */
export function basisWeightFromGsm(gsm: number, kind: BasisWeightKind = 'cover'): number {
  return (gsm * reamAreaM2(kind)) / GRAMS_PER_POUND
}

/** "65 lb cover" */
export function formatBasisWeight(pounds: number, kind: BasisWeightKind): string {
  return `${Number(pounds.toFixed(1))} lb ${kind}`
}
