// Seeds the demo studio's stock, materials, favourites and test cuts through the same services as the API.
// Idempotent: stock and own materials are matched by name; the test-cut story is written only into a workspace
// without test cuts.
import { and, count, eq, inArray, sql } from 'drizzle-orm'
import type { AppContext } from '../server/context.js'
import { materialRecipes, materials, recipeChanges, stockItems, testCuts, users } from '../server/db/schema/index.js'
import * as materialsService from '../server/features/materials/materials.service.js'
import * as recipesService from '../server/features/materials/recipes.service.js'
import * as testCutsService from '../server/features/materials/testCuts.service.js'
import * as stockService from '../server/features/stock/stock.service.js'
import { demoFavourites, demoOwnMaterial, demoStock, demoTestCuts, demoTuning } from '../fixtures/demo-stock.js'

export async function seedStockAndMaterials(context: AppContext, workspaceId: string): Promise<{ stockAdded: number; testCutsAdded: number }> {
  const { db } = context
  const people = await db.select({ id: users.id, email: users.email }).from(users).where(inArray(users.email, [...new Set([...demoFavourites.map((entry) => entry.email), ...demoTestCuts.map((entry) => entry.email)])]))
  const userId = (email: string) => people.find((person) => person.email === email)!.id
  const ownerId = userId('owner@thistle-tack.example')

  await materialsService.ensureCatalogue(db, workspaceId)
  const [existingOwn] = await db
    .select({ id: materials.id })
    .from(materials)
    .where(and(eq(materials.workspaceId, workspaceId), eq(materials.name, demoOwnMaterial.name)))
  let ownMaterialId = existingOwn?.id
  if (!ownMaterialId) {
    const { key: _key, blade, ...material } = demoOwnMaterial
    const created = await materialsService.createMaterial(context, workspaceId, ownerId, { ...material, basisWeight: null, grammageGsm: null, laserSafe: true })
    await recipesService.createRecipe(context, workspaceId, created.id, ownerId, { ...blade, bladeAngleDeg: blade.bladeAngleDeg })
    ownMaterialId = created.id
  }

  const catalogueRows = await db
    .select({ id: materials.id, key: materials.catalogueKey })
    .from(materials)
    .where(and(eq(materials.workspaceId, workspaceId), sql`${materials.catalogueKey} is not null`))
  const materialId = (key: string) => (key === demoOwnMaterial.key ? ownMaterialId! : catalogueRows.find((row) => row.key === key)!.id)

  const present = new Set((await db.select({ name: stockItems.name }).from(stockItems).where(eq(stockItems.workspaceId, workspaceId))).map((row) => row.name))
  let stockAdded = 0
  for (const { materialKey, archived, ...stock } of demoStock) {
    if (present.has(stock.name)) continue
    const created = await stockService.createStock(context, workspaceId, ownerId, {
      margins: { topMm: 0, rightMm: 0, bottomMm: 0, leftMm: 0 },
      supplierNote: '',
      price: null,
      quantityOnHand: 0,
      ...stock,
      materialId: materialKey ? materialId(materialKey) : null,
    } as Parameters<typeof stockService.createStock>[3])
    if (archived) await stockService.updateStock(context, workspaceId, created.id, { archived: true })
    stockAdded++
  }

  for (const { email, materialKeys } of demoFavourites) {
    for (const key of materialKeys) await materialsService.addFavourite(context, workspaceId, userId(email), materialId(key))
  }

  const [cuts] = await db.select({ value: count() }).from(testCuts).where(eq(testCuts.workspaceId, workspaceId))
  if ((cuts?.value ?? 0) > 0) return { stockAdded, testCutsAdded: 0 }

  // The story is told through the services, then moved back to its days so the timeline reads like a past week.
  const daysAgo = (days: number, minutes: number) => new Date(Date.now() - days * 86_400_000 + minutes * 60_000)
  let minute = 0
  for (const cut of demoTestCuts) {
    minute += 20
    const at = daysAgo(cut.daysAgo, minute)
    const logged = await testCutsService.createTestCut(context, workspaceId, materialId(cut.materialKey), userId(cut.email), { toolKind: 'blade', outcome: cut.outcome, note: cut.note }, undefined)
    await db.update(testCuts).set({ createdAt: at }).where(eq(testCuts.id, logged.id))
    if (cut.applySuggestion) {
      await testCutsService.applySuggestion(context, workspaceId, materialId(cut.materialKey), logged.id, userId(cut.email))
      const appliedAt = new Date(at.getTime() + 5 * 60_000)
      await db.update(testCuts).set({ suggestionAppliedAt: appliedAt }).where(eq(testCuts.id, logged.id))
      await db.update(recipeChanges).set({ changedAt: appliedAt }).where(eq(recipeChanges.testCutId, logged.id))
    }
  }
  await recipesService.updateRecipe(context, workspaceId, materialId(demoTuning.materialKey), 'blade', userId(demoTuning.email), { ...demoTuning.changes, reason: demoTuning.reason })
  await db
    .update(recipeChanges)
    .set({ changedAt: daysAgo(demoTuning.daysAgo, 0) })
    .where(and(eq(recipeChanges.materialId, materialId(demoTuning.materialKey)), eq(recipeChanges.source, 'tuned'), eq(recipeChanges.reason, demoTuning.reason)))
  // Each recipe was last changed when its history says, not when the seed ran.
  await db.execute(sql`
    update ${materialRecipes} set updated_at = latest.changed_at
    from (select material_id, tool_kind, max(changed_at) as changed_at from ${recipeChanges} where workspace_id = ${workspaceId} group by material_id, tool_kind) as latest
    where ${materialRecipes.materialId} = latest.material_id and ${materialRecipes.toolKind} = latest.tool_kind`)
  return { stockAdded, testCutsAdded: demoTestCuts.length }
}
