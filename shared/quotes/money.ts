/**
 * Money as integer minor units (cents) of an ISO 4217 currency. Amounts are rounded once per line, half away from
 * zero ("half up" for the positive amounts of a quote), so every printed line adds up to the printed total.
 */

/** ISO 4217 currencies whose minor unit is not 1/100 (ISO 4217 list one, "minor unit" column). */
const minorDigitsByCurrency: Record<string, number> = {
  BIF: 0, CLP: 0, DJF: 0, GNF: 0, ISK: 0, JPY: 0, KMF: 0, KRW: 0, PYG: 0, RWF: 0, UGX: 0, UYI: 0, VND: 0, VUV: 0, XAF: 0, XOF: 0, XPF: 0,
  BHD: 3, IQD: 3, JOD: 3, KWD: 3, LYD: 3, OMR: 3, TND: 3,
}

/** Digits after the decimal point of a currency's minor unit (2 for most). */
export function minorDigits(currency: string): number {
  return minorDigitsByCurrency[currency.toUpperCase()] ?? 2
}

/**
 * Rounds to a whole number, half away from zero. The value is first cut to 9 significant decimals so that binary
 * noise (1.005 × 100 = 100.49999…) does not turn an exact half into a value just below it.
 */
export function roundHalfUp(value: number): number {
  const cleaned = Number(value.toFixed(9))
  return Math.sign(cleaned) * Math.round(Math.abs(cleaned))
}

/** Major units (4.5 EUR) to minor units (450), rounded half up. */
export function toMinor(amount: number, currency: string): number {
  return roundHalfUp(amount * 10 ** minorDigits(currency))
}

/** Minor units to a plain decimal string with the currency's digits: 1350 → "13.50". No currency sign, no grouping. */
export function formatMinor(amountMinor: number, currency: string): string {
  const digits = minorDigits(currency)
  const negative = amountMinor < 0
  const whole = Math.abs(Math.trunc(amountMinor))
  const text = digits === 0 ? String(whole) : `${Math.floor(whole / 10 ** digits)}.${String(whole % 10 ** digits).padStart(digits, '0')}`
  return negative ? `-${text}` : text
}

/** Minor units as a major-unit number (1350 → 13.5), for inputs and the payment provider's display only. */
export function fromMinor(amountMinor: number, currency: string): number {
  return amountMinor / 10 ** minorDigits(currency)
}

/** A quantity with at most `digits` decimals and no trailing zeros: 0.75, 6, 1.2345. */
export function formatQuantity(value: number, digits = 4): string {
  return String(Number(value.toFixed(digits)))
}
