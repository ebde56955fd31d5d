import type { z } from 'zod'
import { gsmFromBasisWeight, type BasisWeightKind } from '../../../shared/materials/basisWeight.js'
import { catalogue, catalogueRecipeValues, catalogueVersion, findCatalogueEntry } from '../../../shared/materials/catalogue.js'
import { defaultForceRange, defaultForceStep, defaultPowerStepPercent } from '../../../shared/materials/forceSteps.js'
import {
  recipeFields,
  type BladeType,
  type createMaterialRequestSchema,
  type FavouritesResponse,
  type MaterialCategory,
  type MaterialDetail,
  type MaterialListResponse,
  type MaterialSettings,
  type MaterialSummary,
  type Recipe,
  type RecipeValues,
  type updateMaterialRequestSchema,
  type updateMaterialSettingsRequestSchema,
} from '../../../shared/schemas/materials.js'
import type { AppContext } from '../../context.js'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { isForeignKeyViolation } from '../../db/errors.js'
import { conflict, invalidField, notFound } from '../../errors.js'
import * as repo from './materials.repo.js'

export const defaultSettings: MaterialSettings = {
  forceStep: defaultForceStep,
  forceMin: defaultForceRange.min,
  forceMax: defaultForceRange.max,
  powerStepPercent: defaultPowerStepPercent,
}

function toSettings(row: repo.SettingsRow | undefined): MaterialSettings {
  if (!row) return { ...defaultSettings }
  return { forceStep: row.forceStep, forceMin: row.forceMin, forceMax: row.forceMax, powerStepPercent: row.powerStepPercent }
}

export async function settingsOf(db: DatabaseOrTransaction, workspaceId: string): Promise<MaterialSettings> {
  return toSettings(await repo.findSettings(db, workspaceId))
}

/**
 * Copies catalogue entries the workspace does not hold yet, with their starting recipes. Runs once per catalogue
 * version: later visits read one settings row and return. Conflicts (a concurrent first visit) are skipped.
 */
export async function ensureCatalogue(db: DatabaseOrTransaction, workspaceId: string): Promise<void> {
  const settings = await repo.findSettings(db, workspaceId)
  if (settings && settings.catalogueVersion >= catalogueVersion) return
  await db.transaction(async (tx) => {
    const inserted = await repo.insertCatalogueMaterials(
      tx,
      catalogue.map((entry) => ({
        workspaceId,
        catalogueKey: entry.key,
        name: entry.name,
        category: entry.category,
        description: entry.description,
        thicknessMm: entry.thicknessMm,
        basisWeightLb: entry.basisWeight?.pounds ?? null,
        basisWeightKind: entry.basisWeight?.kind ?? null,
        grammageGsm: entry.grammageGsm,
        laserSafe: entry.laserSafe,
      })),
    )
    const recipes: repo.NewRecipeRow[] = []
    for (const { id, catalogueKey } of inserted) {
      const entry = findCatalogueEntry(catalogueKey)!
      for (const toolKind of ['blade', 'laser'] as const) {
        const values = catalogueRecipeValues(entry, toolKind)
        if (values) recipes.push({ workspaceId, materialId: id, toolKind, ...values })
      }
    }
    await repo.insertRecipes(tx, recipes)
    await repo.upsertSettings(tx, workspaceId, { catalogueVersion })
  })
}

export function recipeValuesOf(row: repo.RecipeRow): RecipeValues {
  return {
    bladeType: row.bladeType as BladeType | null,
    bladeAngleDeg: row.bladeAngleDeg,
    force: row.force,
    passes: row.passes,
    speedMmS: row.speedMmS,
    powerPercent: row.powerPercent,
  }
}

export function toRecipe(row: repo.RecipeRow, updatedByName: string | null, catalogueKey: string | null): Recipe {
  const values = recipeValuesOf(row)
  const entry = findCatalogueEntry(catalogueKey)
  const startingPoint = entry ? catalogueRecipeValues(entry, row.toolKind) : null
  return {
    id: row.id,
    toolKind: row.toolKind,
    ...values,
    catalogue: startingPoint,
    tuned: startingPoint !== null && recipeFields.some((field) => startingPoint[field] !== values[field]),
    updatedAt: row.updatedAt.toISOString(),
    updatedByName,
  }
}

/** Given grammage, or the one the US basis-weight definition gives (shared/materials/basisWeight.ts), unrounded: the client rounds for display. */
function grammageOf(row: repo.MaterialRow): number | null {
  if (row.basisWeightLb !== null && row.basisWeightKind !== null) return gsmFromBasisWeight(row.basisWeightLb, row.basisWeightKind as BasisWeightKind)
  return row.grammageGsm
}

function toSummary(row: repo.MaterialRow, isFavourite: boolean, recipes: repo.RecipeWithAuthor[]): MaterialSummary {
  return {
    id: row.id,
    catalogueKey: row.catalogueKey,
    name: row.name,
    category: row.category as MaterialCategory,
    description: row.description,
    thicknessMm: row.thicknessMm,
    basisWeight: row.basisWeightLb !== null && row.basisWeightKind !== null ? { pounds: row.basisWeightLb, kind: row.basisWeightKind as BasisWeightKind } : null,
    grammageGsm: grammageOf(row),
    laserSafe: row.laserSafe,
    archived: row.archivedAt !== null,
    isFavourite,
    recipes: recipes.filter((entry) => entry.recipe.materialId === row.id).map((entry) => toRecipe(entry.recipe, entry.updatedByName, row.catalogueKey)),
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  }
}

/** The material, or 404: every route under a material id starts here. */
export async function requireMaterial(db: DatabaseOrTransaction, workspaceId: string, materialId: string, userId: string) {
  const found = await repo.findMaterial(db, workspaceId, materialId, userId)
  if (!found) throw notFound('Material')
  return found
}

export async function listMaterials(context: AppContext, workspaceId: string, userId: string, filter: repo.MaterialFilter): Promise<MaterialListResponse> {
  await ensureCatalogue(context.db, workspaceId)
  const { rows, total } = await repo.listMaterials(context.db, workspaceId, userId, filter)
  const recipes = await repo.recipesOf(
    context.db,
    rows.map((row) => row.material.id),
  )
  return { items: rows.map((row) => toSummary(row.material, row.isFavourite, recipes)), total, page: filter.page, pageSize: filter.pageSize }
}

export async function getMaterial(context: AppContext, workspaceId: string, materialId: string, userId: string): Promise<MaterialDetail> {
  await ensureCatalogue(context.db, workspaceId)
  const found = await requireMaterial(context.db, workspaceId, materialId, userId)
  const [recipes, settings, usage] = await Promise.all([repo.recipesOf(context.db, [materialId]), settingsOf(context.db, workspaceId), repo.usageCounts(context.db, materialId)])
  return { ...toSummary(found.material, found.isFavourite, recipes), settings, ...usage }
}

type MaterialChanges = z.output<typeof updateMaterialRequestSchema>

function columnsOf(changes: Partial<z.output<typeof createMaterialRequestSchema>>): Partial<repo.NewMaterialRow> {
  const columns: Partial<repo.NewMaterialRow> = {}
  if (changes.name !== undefined) columns.name = changes.name
  if (changes.category !== undefined) columns.category = changes.category
  if (changes.description !== undefined) columns.description = changes.description
  if (changes.thicknessMm !== undefined) columns.thicknessMm = changes.thicknessMm
  if (changes.basisWeight !== undefined) {
    columns.basisWeightLb = changes.basisWeight?.pounds ?? null
    columns.basisWeightKind = changes.basisWeight?.kind ?? null
  }
  if (changes.grammageGsm !== undefined) columns.grammageGsm = changes.grammageGsm
  if (changes.laserSafe !== undefined) columns.laserSafe = changes.laserSafe
  return columns
}

export async function createMaterial(context: AppContext, workspaceId: string, userId: string, body: z.output<typeof createMaterialRequestSchema>): Promise<MaterialDetail> {
  const { id } = await repo.insertMaterial(context.db, { workspaceId, createdBy: userId, name: body.name, category: body.category, ...columnsOf(body) })
  return getMaterial(context, workspaceId, id, userId)
}

export async function updateMaterial(context: AppContext, workspaceId: string, materialId: string, userId: string, changes: MaterialChanges): Promise<MaterialDetail> {
  await context.db.transaction(async (tx) => {
    await requireMaterial(tx, workspaceId, materialId, userId)
    // A laser recipe on a material marked unsafe would invite lasering PVC: the recipe goes first.
    if (changes.laserSafe === false && (await repo.findRecipe(tx, materialId, 'laser'))) {
      throw invalidField('body.laserSafe', 'This material has a laser recipe: delete it before marking the material unsafe to laser')
    }
    const archived = changes.archived === undefined ? {} : { archivedAt: changes.archived ? new Date() : null }
    await repo.updateMaterial(tx, workspaceId, materialId, { ...columnsOf(changes), ...archived })
  })
  return getMaterial(context, workspaceId, materialId, userId)
}

/**
 * Deletes one of the workspace's own materials that nothing uses. Catalogue copies are archived instead (they come
 * with the product); stock on the shelf and test cuts refer to a material by foreign key, so the database refuses
 * then and the answer says to archive.
 */
export async function deleteMaterial(context: AppContext, workspaceId: string, materialId: string, userId: string): Promise<void> {
  const found = await requireMaterial(context.db, workspaceId, materialId, userId)
  if (found.material.catalogueKey) throw conflict('Materials from the catalogue cannot be deleted; archive it to hide it')
  try {
    await repo.deleteMaterial(context.db, workspaceId, materialId)
  } catch (error) {
    if (isForeignKeyViolation(error)) throw conflict('This material is used by stock or test cuts; archive it instead of deleting it')
    throw error
  }
}

export async function getSettings(context: AppContext, workspaceId: string): Promise<MaterialSettings> {
  return settingsOf(context.db, workspaceId)
}

export async function updateSettings(context: AppContext, workspaceId: string, changes: z.output<typeof updateMaterialSettingsRequestSchema>): Promise<MaterialSettings> {
  return context.db.transaction(async (tx) => {
    const current = await settingsOf(tx, workspaceId)
    const next = { ...current, ...Object.fromEntries(Object.entries(changes).filter(([, value]) => value !== undefined)) }
    if (next.forceMin >= next.forceMax) throw invalidField(changes.forceMax !== undefined ? 'body.forceMax' : 'body.forceMin', 'The highest force must be above the lowest')
    if (next.forceStep > next.forceMax - next.forceMin) throw invalidField('body.forceStep', 'The force step must fit inside the force range')
    return toSettings(await repo.upsertSettings(tx, workspaceId, next))
  })
}

export async function listFavourites(context: AppContext, workspaceId: string, userId: string): Promise<FavouritesResponse> {
  return { materialIds: await repo.favouriteIds(context.db, workspaceId, userId) }
}

export async function addFavourite(context: AppContext, workspaceId: string, userId: string, materialId: string): Promise<FavouritesResponse> {
  await requireMaterial(context.db, workspaceId, materialId, userId)
  await repo.addFavourite(context.db, workspaceId, userId, materialId)
  return listFavourites(context, workspaceId, userId)
}

export async function removeFavourite(context: AppContext, workspaceId: string, userId: string, materialId: string): Promise<FavouritesResponse> {
  await requireMaterial(context.db, workspaceId, materialId, userId)
  await repo.removeFavourite(context.db, userId, materialId)
  return listFavourites(context, workspaceId, userId)
}

