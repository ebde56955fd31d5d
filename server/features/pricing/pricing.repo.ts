import { eq } from 'drizzle-orm'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { pricingSettings } from '../../db/schema/index.js'

export type PricingRow = typeof pricingSettings.$inferSelect
export type NewPricingRow = typeof pricingSettings.$inferInsert

export async function findPricing(db: DatabaseOrTransaction, workspaceId: string): Promise<PricingRow | undefined> {
  const [row] = await db.select().from(pricingSettings).where(eq(pricingSettings.workspaceId, workspaceId))
  return row
}

export async function upsertPricing(db: DatabaseOrTransaction, row: NewPricingRow): Promise<void> {
  const { workspaceId: _workspaceId, ...changes } = row
  await db
    .insert(pricingSettings)
    .values(row)
    .onConflictDoUpdate({ target: pricingSettings.workspaceId, set: { ...changes, updatedAt: new Date() } })
}
