// Seeds the demo studio's pricing settings and its quotes through the same services as the API.
// Idempotent: pricing is written only while the workspace has none; quotes are matched by title.
import { and, eq, inArray } from 'drizzle-orm'
import type { AppContext } from '../server/context.js'
import { cutJobs, pricingSettings, quotes } from '../server/db/schema/index.js'
import * as pricingService from '../server/features/pricing/pricing.service.js'
import * as quotesService from '../server/features/quotes/quotes.service.js'
import { pricingSettingsBodySchema } from '../shared/schemas/pricing.js'
import { createQuoteRequestSchema } from '../shared/schemas/quotes.js'
import { demoPricing, demoQuotes } from '../fixtures/demo-quotes.js'

export async function seedQuotes(context: AppContext, workspaceId: string, ownerId: string): Promise<{ added: number; kept: number }> {
  const { db } = context
  const [pricing] = await db.select({ workspaceId: pricingSettings.workspaceId }).from(pricingSettings).where(eq(pricingSettings.workspaceId, workspaceId))
  if (!pricing) await pricingService.savePricing(context, workspaceId, ownerId, pricingSettingsBodySchema.parse(demoPricing))

  const titles = demoQuotes.map((quote) => quote.title)
  const present = new Set(
    (await db.select({ title: quotes.title }).from(quotes).where(and(eq(quotes.workspaceId, workspaceId), inArray(quotes.title, titles)))).map((row) => row.title),
  )
  let added = 0
  for (const demo of demoQuotes) {
    if (present.has(demo.title)) continue
    // Demo jobs come from another seed; a quote prices its job when that job is there, else it keeps its typed lines.
    const [job] = demo.jobTitle
      ? await db.select({ id: cutJobs.id }).from(cutJobs).where(and(eq(cutJobs.workspaceId, workspaceId), eq(cutJobs.title, demo.jobTitle)))
      : []
    const body = createQuoteRequestSchema.parse({
      source: job ? { kind: 'job', jobId: job.id } : { kind: 'manual' },
      title: demo.title,
      customerName: demo.customerName,
      customerEmail: demo.customerEmail,
      ...(job ? {} : { lines: demo.lines }),
    })
    await quotesService.createQuote(context, workspaceId, ownerId, body)
    added += 1
  }
  return { added, kept: present.size }
}
