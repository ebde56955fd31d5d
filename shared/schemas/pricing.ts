import { z } from 'zod'

/**
 * A workspace's pricing settings: what its machine and labour time cost, what a job adds on top, and the tax.
 * Money is in integer minor units (cents) of `currency` (ISO 4217); percentages are plain percent (40 = 40 %).
 */

export const currencyCodeSchema = z
  .string({ error: 'Enter a currency code' })
  .trim()
  .regex(/^[A-Za-z]{3}$/, { error: 'Use a three-letter currency code such as EUR' })
  .transform((code) => code.toUpperCase())

const minorAmount = (field: string) =>
  z
    .number({ error: `${field} must be a number` })
    .int({ error: `${field} must be whole minor units (cents)` })
    .min(0, { error: `${field} cannot be negative` })
    .max(100_000_000, { error: `${field} must be at most 1,000,000.00` })

const percent = (field: string, max: number) =>
  z
    .number({ error: `${field} must be a number` })
    .min(0, { error: `${field} cannot be negative` })
    .max(max, { error: `${field} must be at most ${max} %` })

export const pricingSettingsBodySchema = z.object({
  currency: currencyCodeSchema,
  machineRatePerHourMinor: minorAmount('The machine rate'),
  labourRatePerHourMinor: minorAmount('The labour rate'),
  setupFeeMinor: minorAmount('The setup fee'),
  /** Weeding and finishing by hand, per piece cut. */
  weedingMinutesPerPiece: z
    .number({ error: 'Weeding minutes must be a number' })
    .min(0, { error: 'Weeding minutes cannot be negative' })
    .max(600, { error: 'Weeding minutes must be at most 600 per piece' }),
  materialMarkupPercent: percent('The material markup', 1000),
  minimumOrderMinor: minorAmount('The minimum order'),
  taxRatePercent: percent('The tax rate', 100),
  /** Days a sent quote stays open before it expires. */
  quoteValidDays: z
    .number({ error: 'Valid days must be a number' })
    .int({ error: 'Valid days must be a whole number' })
    .min(1, { error: 'A quote must stay valid at least 1 day' })
    .max(365, { error: 'A quote can stay valid at most 365 days' }),
})
export type PricingSettingsBody = z.input<typeof pricingSettingsBodySchema>

export const pricingSettingsSchema = pricingSettingsBodySchema.extend({
  currency: z.string(),
  /** False while the workspace still uses the defaults (nothing saved yet). */
  saved: z.boolean(),
  updatedAt: z.string().nullable(),
})
export type PricingSettings = z.infer<typeof pricingSettingsSchema>

/** A new workspace's starting point: zero rates, so no invented price appears in a quote unnoticed. */
export const defaultPricingSettings: z.output<typeof pricingSettingsBodySchema> = {
  currency: 'EUR',
  machineRatePerHourMinor: 0,
  labourRatePerHourMinor: 0,
  setupFeeMinor: 0,
  weedingMinutesPerPiece: 0,
  materialMarkupPercent: 0,
  minimumOrderMinor: 0,
  taxRatePercent: 0,
  quoteValidDays: 30,
}
