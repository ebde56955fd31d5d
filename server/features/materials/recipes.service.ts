import type { z } from 'zod'
import { catalogueRecipeValues, findCatalogueEntry } from '../../../shared/materials/catalogue.js'
import { isWithin, type ForceRange } from '../../../shared/materials/forceSteps.js'
import {
  recipeFields,
  type createRecipeRequestSchema,
  type Recipe,
  type RecipeChange,
  type RecipeField,
  type RecipeHistoryResponse,
  type RecipeToolKind,
  type RecipeValues,
  type updateRecipeRequestSchema,
} from '../../../shared/schemas/materials.js'
import type { AppContext } from '../../context.js'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { conflict, invalidField, notFound } from '../../errors.js'
import * as repo from './materials.repo.js'
import { recipeValuesOf, requireMaterial, settingsOf, toRecipe } from './materials.service.js'

export type ChangeSource = 'created' | 'tuned' | 'suggestion' | 'reset'

/** Fields that mean something for each tool kind; the others stay null. */
const fieldsOf: Record<RecipeToolKind, readonly RecipeField[]> = {
  blade: ['bladeType', 'bladeAngleDeg', 'force', 'passes', 'speedMmS'],
  laser: ['powerPercent', 'passes', 'speedMmS'],
}

const toolKindNoun: Record<RecipeToolKind, string> = { blade: 'blade', laser: 'laser' }

export function checkForce(force: number | null | undefined, range: ForceRange, rangeName: string, field = 'body.force'): void {
  if (force === null || force === undefined) return
  if (!isWithin(force, range)) throw invalidField(field, `Force must be within ${range.min}–${range.max}, ${rangeName}`)
}

export const workspaceRangeName = "this workspace's force range (Materials → Tuning settings)"

export function toChange(row: repo.RecipeChangeRow, changedByName: string | null): RecipeChange {
  return {
    id: row.id,
    toolKind: row.toolKind,
    field: row.field as RecipeField,
    from: row.fromValue ?? null,
    to: row.toValue ?? null,
    reason: row.reason,
    source: row.source,
    testCutId: row.testCutId,
    changedByName,
    changedAt: row.changedAt.toISOString(),
  }
}

export interface ChangeMeta {
  workspaceId: string
  userId: string
  source: ChangeSource
  reason: string
  testCutId?: string | null
}

/**
 * Writes the values that differ from the stored recipe and one history entry per changed field, in the caller's
 * transaction (the recipe row is locked by then). Unchanged values leave no entry; nothing changed, nothing written.
 */
export async function writeRecipeValues(tx: DatabaseOrTransaction, recipe: repo.RecipeRow, next: Partial<RecipeValues>, meta: ChangeMeta) {
  const current = recipeValuesOf(recipe)
  const changed = recipeFields.filter((field) => next[field] !== undefined && next[field] !== current[field])
  if (changed.length === 0) return { recipe, changes: [] as repo.RecipeChangeRow[] }
  const at = new Date()
  const updated = await repo.updateRecipe(tx, recipe.id, { ...Object.fromEntries(changed.map((field) => [field, next[field]])), updatedBy: meta.userId, updatedAt: at })
  const changes = await repo.insertRecipeChanges(
    tx,
    changed.map((field) => ({
      workspaceId: meta.workspaceId,
      materialId: recipe.materialId,
      toolKind: recipe.toolKind,
      field,
      fromValue: current[field],
      toValue: next[field] ?? null,
      reason: meta.reason,
      source: meta.source,
      testCutId: meta.testCutId ?? null,
      changedBy: meta.userId,
      changedAt: at,
    })),
  )
  return { recipe: updated, changes }
}

async function recipeFor(context: AppContext, materialId: string, toolKind: RecipeToolKind, catalogueKey: string | null): Promise<Recipe> {
  const recipes = await repo.recipesOf(context.db, [materialId])
  const found = recipes.find((entry) => entry.recipe.toolKind === toolKind)
  if (!found) throw notFound('Recipe')
  return toRecipe(found.recipe, found.updatedByName, catalogueKey)
}

export async function listRecipes(context: AppContext, workspaceId: string, materialId: string, userId: string): Promise<Recipe[]> {
  const { material } = await requireMaterial(context.db, workspaceId, materialId, userId)
  const recipes = await repo.recipesOf(context.db, [materialId])
  return recipes.map((entry) => toRecipe(entry.recipe, entry.updatedByName, material.catalogueKey))
}

export async function createRecipe(context: AppContext, workspaceId: string, materialId: string, userId: string, body: z.output<typeof createRecipeRequestSchema>): Promise<Recipe> {
  const catalogueKey = await context.db.transaction(async (tx) => {
    const { material } = await requireMaterial(tx, workspaceId, materialId, userId)
    if (body.toolKind === 'laser' && !material.laserSafe) {
      throw invalidField('body.toolKind', 'This material is not marked safe to laser. Never laser-cut PVC or vinyl: it releases chlorine gas.')
    }
    const settings = await settingsOf(tx, workspaceId)
    if (body.toolKind === 'blade') checkForce(body.force, { min: settings.forceMin, max: settings.forceMax }, workspaceRangeName)
    const values: RecipeValues =
      body.toolKind === 'blade'
        ? { bladeType: body.bladeType, bladeAngleDeg: body.bladeType === 'rotary' ? null : body.bladeAngleDeg, force: body.force, passes: body.passes, speedMmS: body.speedMmS, powerPercent: null }
        : { bladeType: null, bladeAngleDeg: null, force: null, passes: body.passes, speedMmS: body.speedMmS, powerPercent: body.powerPercent }
    const [inserted] = await repo.insertRecipes(tx, [{ workspaceId, materialId, toolKind: body.toolKind, ...values, updatedBy: userId }])
    if (!inserted) throw conflict(`This material already has a ${toolKindNoun[body.toolKind]} recipe; tune it instead`)
    await repo.insertRecipeChanges(
      tx,
      fieldsOf[body.toolKind]
        .filter((field) => values[field] !== null)
        .map((field) => ({
          workspaceId,
          materialId,
          toolKind: body.toolKind,
          field,
          fromValue: null,
          toValue: values[field],
          reason: body.reason ?? 'Recipe added',
          source: 'created' as const,
          changedBy: userId,
          changedAt: inserted.createdAt,
        })),
    )
    return material.catalogueKey
  })
  return recipeFor(context, materialId, body.toolKind, catalogueKey)
}

export async function updateRecipe(
  context: AppContext,
  workspaceId: string,
  materialId: string,
  toolKind: RecipeToolKind,
  userId: string,
  body: z.output<typeof updateRecipeRequestSchema>,
): Promise<Recipe> {
  const catalogueKey = await context.db.transaction(async (tx) => {
    const { material } = await requireMaterial(tx, workspaceId, materialId, userId)
    const recipe = await repo.findRecipe(tx, materialId, toolKind, true)
    if (!recipe) throw notFound('Recipe')
    const allowed = fieldsOf[toolKind]
    for (const field of recipeFields) {
      if (body[field] !== undefined && !allowed.includes(field)) throw invalidField(`body.${field}`, `A ${toolKindNoun[toolKind]} recipe has no ${field}`)
    }
    const settings = await settingsOf(tx, workspaceId)
    checkForce(body.force, { min: settings.forceMin, max: settings.forceMax }, workspaceRangeName)
    const next: Partial<RecipeValues> = Object.fromEntries(recipeFields.filter((field) => body[field] !== undefined).map((field) => [field, body[field]]))
    // A rotary blade rolls rather than drags: it has no cutting angle.
    if (next.bladeType === 'rotary') next.bladeAngleDeg = null
    await writeRecipeValues(tx, recipe, next, { workspaceId, userId, source: 'tuned', reason: body.reason })
    return material.catalogueKey
  })
  return recipeFor(context, materialId, toolKind, catalogueKey)
}

/** Back to the catalogue's starting point (recreated if it was deleted), recorded like any other change. */
export async function resetRecipe(context: AppContext, workspaceId: string, materialId: string, toolKind: RecipeToolKind, userId: string, reason: string | undefined): Promise<Recipe> {
  const catalogueKey = await context.db.transaction(async (tx) => {
    const { material } = await requireMaterial(tx, workspaceId, materialId, userId)
    const entry = findCatalogueEntry(material.catalogueKey)
    if (!entry) throw conflict('This material is your own, not from the catalogue: there is no catalogue value to reset to')
    const startingPoint = catalogueRecipeValues(entry, toolKind)
    if (!startingPoint) throw conflict(`The catalogue has no ${toolKindNoun[toolKind]} recipe for this material`)
    const meta = { workspaceId, userId, source: 'reset' as const, reason: reason ?? 'Reset to the catalogue starting point' }
    let recipe = await repo.findRecipe(tx, materialId, toolKind, true)
    if (!recipe) {
      const [created] = await repo.insertRecipes(tx, [{ workspaceId, materialId, toolKind, ...startingPoint, updatedBy: userId }])
      recipe = created ?? (await repo.findRecipe(tx, materialId, toolKind, true))!
      await repo.insertRecipeChanges(
        tx,
        fieldsOf[toolKind]
          .filter((field) => startingPoint[field] !== null)
          .map((field) => ({ ...meta, materialId, toolKind, field, fromValue: null, toValue: startingPoint[field], changedBy: userId, changedAt: recipe!.createdAt })),
      )
    } else {
      await writeRecipeValues(tx, recipe, startingPoint, meta)
    }
    return material.catalogueKey
  })
  return recipeFor(context, materialId, toolKind, catalogueKey)
}

export async function deleteRecipe(context: AppContext, workspaceId: string, materialId: string, toolKind: RecipeToolKind, userId: string): Promise<void> {
  await requireMaterial(context.db, workspaceId, materialId, userId)
  const deleted = await repo.deleteRecipe(context.db, materialId, toolKind)
  if (!deleted) throw notFound('Recipe')
}

export async function listHistory(
  context: AppContext,
  workspaceId: string,
  materialId: string,
  userId: string,
  filter: { toolKind?: RecipeToolKind; page: number; pageSize: number },
): Promise<RecipeHistoryResponse> {
  await requireMaterial(context.db, workspaceId, materialId, userId)
  const { rows, total } = await repo.listRecipeChanges(context.db, materialId, filter)
  return { items: rows.map((row) => toChange(row.change, row.changedByName)), total, page: filter.page, pageSize: filter.pageSize }
}
