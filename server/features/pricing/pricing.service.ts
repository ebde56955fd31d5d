import type { z } from 'zod'
import { defaultPricingSettings, type PricingSettings, type pricingSettingsBodySchema } from '../../../shared/schemas/pricing.js'
import type { AppContext } from '../../context.js'
import type { DatabaseOrTransaction } from '../../db/client.js'
import * as repo from './pricing.repo.js'

export type ValidPricing = z.output<typeof pricingSettingsBodySchema>

/** The settings a workspace prices with: its saved row, or the all-zero defaults. */
export async function pricingOf(db: DatabaseOrTransaction, workspaceId: string): Promise<ValidPricing & { saved: boolean; updatedAt: Date | null }> {
  const row = await repo.findPricing(db, workspaceId)
  if (!row) return { ...defaultPricingSettings, saved: false, updatedAt: null }
  return {
    currency: row.currency,
    machineRatePerHourMinor: row.machineRatePerHourMinor,
    labourRatePerHourMinor: row.labourRatePerHourMinor,
    setupFeeMinor: row.setupFeeMinor,
    weedingMinutesPerPiece: row.weedingMinutesPerPiece,
    materialMarkupPercent: row.materialMarkupPercent,
    minimumOrderMinor: row.minimumOrderMinor,
    taxRatePercent: row.taxRatePercent,
    quoteValidDays: row.quoteValidDays,
    saved: true,
    updatedAt: row.updatedAt,
  }
}

export async function getPricing(context: AppContext, workspaceId: string): Promise<PricingSettings> {
  const pricing = await pricingOf(context.db, workspaceId)
  return { ...pricing, updatedAt: pricing.updatedAt?.toISOString() ?? null }
}

/** Replaces the settings as a whole; quotes already made keep the values they were priced with. */
export async function savePricing(context: AppContext, workspaceId: string, userId: string, settings: ValidPricing): Promise<PricingSettings> {
  await repo.upsertPricing(context.db, { workspaceId, ...settings, updatedBy: userId })
  return getPricing(context, workspaceId)
}
