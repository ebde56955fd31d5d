import type { z } from 'zod'
import { effectiveForceRange } from '../../../shared/materials/forceSteps.js'
import { describeChanges, suggestFromTestCut } from '../../../shared/materials/suggestions.js'
import type {
  ApplySuggestionResponse,
  createTestCutRequestSchema,
  MaterialSettings,
  RecipeToolKind,
  RecipeValues,
  TestCut,
  TestCutListResponse,
  TestCutOutcome,
} from '../../../shared/schemas/materials.js'
import type { AppContext } from '../../context.js'
import { conflict, invalidField, notFound } from '../../errors.js'
import * as materialsRepo from './materials.repo.js'
import { recipeValuesOf, requireMaterial, settingsOf, toRecipe } from './materials.service.js'
import { acceptedPhotoTypes, sniffPhotoType } from './photoType.js'
import { checkForce, toChange, workspaceRangeName, writeRecipeValues } from './recipes.service.js'
import * as repo from './testCuts.repo.js'
import * as cuttersRepo from '../cutters/cutters.repo.js'
import type { DatabaseOrTransaction } from '../../db/client.js'

export interface UploadedPhoto {
  originalname: string
  mimetype: string
  buffer: Buffer
}

const outcomeWords: Record<TestCutOutcome, string> = { clean: 'clean', not_through: 'not through', torn: 'torn', too_deep: 'too deep' }

function suggestionFor(testCut: repo.TestCutRow, settings: MaterialSettings) {
  return suggestFromTestCut({
    toolKind: testCut.toolKind,
    recipe: testCut.recipe,
    outcome: testCut.outcome,
    forceStep: settings.forceStep,
    forceRange: effectiveForceRange({ min: settings.forceMin, max: settings.forceMax }, testCut.cutterMaxForce),
    powerStepPercent: settings.powerStepPercent,
  })
}

/** Why the suggestion cannot be applied in one click, or null when it can. */
function applyBlockedReason(testCut: repo.TestCutRow, changeCount: number, currentRecipe: materialsRepo.RecipeRow | undefined): string | null {
  if (testCut.suggestionAppliedAt) return 'Already applied'
  if (changeCount === 0) return 'Nothing to change'
  if (!currentRecipe) return `This material has no ${testCut.toolKind} recipe any more`
  if (currentRecipe.version !== testCut.recipeVersion) return 'The recipe has changed since this test cut: log a new test cut with the current recipe'
  return null
}

function toTestCut(row: repo.TestCutWithNames, settings: MaterialSettings, recipes: materialsRepo.RecipeRow[], urlBase: string): TestCut {
  const { testCut } = row
  const suggestion = suggestionFor(testCut, settings)
  const currentRecipe = recipes.find((recipe) => recipe.toolKind === testCut.toolKind)
  return {
    id: testCut.id,
    materialId: testCut.materialId,
    toolKind: testCut.toolKind,
    recipe: testCut.recipe,
    cutterId: testCut.cutterId,
    bladeId: testCut.bladeId,
    cutterName: row.cutterName,
    bladeText: row.bladeType ? `${row.bladeType} blade${row.bladeAngleDeg !== null ? ` ${row.bladeAngleDeg}°` : ''}` : null,
    cutterMaxForce: testCut.cutterMaxForce,
    outcome: testCut.outcome,
    note: testCut.note,
    photoUrl: row.hasPhoto ? `${urlBase}/${testCut.id}/photo` : null,
    suggestion,
    applyBlockedReason: applyBlockedReason(testCut, suggestion.changes.length, currentRecipe),
    suggestionAppliedAt: testCut.suggestionAppliedAt?.toISOString() ?? null,
    suggestionAppliedByName: row.appliedByName,
    createdAt: testCut.createdAt.toISOString(),
    createdByName: row.createdByName,
  }
}

const testCutsUrl = (workspaceId: string, materialId: string) => `/api/workspaces/${workspaceId}/materials/${materialId}/test-cuts`

async function currentRecipes(context: AppContext, materialId: string): Promise<materialsRepo.RecipeRow[]> {
  return (await materialsRepo.recipesOf(context.db, [materialId])).map((entry) => entry.recipe)
}

export async function listTestCuts(
  context: AppContext,
  workspaceId: string,
  materialId: string,
  userId: string,
  filter: { toolKind?: RecipeToolKind; page: number; pageSize: number },
): Promise<TestCutListResponse> {
  await requireMaterial(context.db, workspaceId, materialId, userId)
  const [{ rows, total }, settings, recipes] = await Promise.all([
    repo.listTestCuts(context.db, workspaceId, materialId, filter),
    settingsOf(context.db, workspaceId),
    currentRecipes(context, materialId),
  ])
  const urlBase = testCutsUrl(workspaceId, materialId)
  return { items: rows.map((row) => toTestCut(row, settings, recipes, urlBase)), total, page: filter.page, pageSize: filter.pageSize }
}

export async function getTestCut(context: AppContext, workspaceId: string, materialId: string, testCutId: string): Promise<TestCut> {
  const [row, settings, recipes] = await Promise.all([
    repo.findTestCut(context.db, workspaceId, materialId, testCutId),
    settingsOf(context.db, workspaceId),
    currentRecipes(context, materialId),
  ])
  if (!row) throw notFound('Test cut')
  return toTestCut(row, settings, recipes, testCutsUrl(workspaceId, materialId))
}

/** Checks the photo by its bytes (the declared type must agree it is an image) before anything is stored. */
function checkPhoto(photo: UploadedPhoto): 'image/png' | 'image/jpeg' | 'image/webp' {
  const declared = photo.mimetype.toLowerCase()
  const sniffed = sniffPhotoType(photo.buffer)
  if (!acceptedPhotoTypes.includes(declared as never) || sniffed === null) {
    throw invalidField('body.photo', `${photo.originalname || 'The photo'} is not a PNG, JPEG or WebP image`)
  }
  return sniffed
}

/**
 * The cutter and blade a test cut was made on, checked to be this workspace's (and the blade that cutter's). A cutter
 * without a blade named means its current blade, so the cut counts for the blade-swap test-cut prompt; the cutter's
 * highest force is the force limit unless the maker gives one.
 */
async function cutterAndBladeOf(
  tx: DatabaseOrTransaction,
  workspaceId: string,
  body: { cutterId?: string; bladeId?: string; cutterMaxForce?: number },
): Promise<{ cutterId: string | null; bladeId: string | null; cutterMaxForce: number | undefined }> {
  let cutterId = body.cutterId ?? null
  let bladeId = body.bladeId ?? null
  if (bladeId) {
    const blade = await cuttersRepo.findBlade(tx, workspaceId, bladeId)
    if (!blade) throw invalidField('body.bladeId', 'No such blade in this workspace')
    if (cutterId && blade.blade.cutterId !== cutterId) throw invalidField('body.bladeId', 'This blade was not fitted to the chosen cutter')
    cutterId = blade.blade.cutterId
  }
  if (!cutterId) return { cutterId: null, bladeId: null, cutterMaxForce: body.cutterMaxForce }
  const cutter = await cuttersRepo.findCutter(tx, workspaceId, cutterId)
  if (!cutter) throw invalidField('body.cutterId', 'No such cutter in this workspace')
  if (!bladeId) bladeId = (await cuttersRepo.currentBladesOf(tx, workspaceId, [cutterId]))[0]?.blade.id ?? null
  return { cutterId, bladeId, cutterMaxForce: body.cutterMaxForce ?? cutter.forceMax ?? undefined }
}

/**
 * Logs a test cut with the material's current recipe for the tool kind, or the values the maker says were cut.
 * The force is checked against the cutter's range when its maximum is given, else the workspace's.
 */
export async function createTestCut(
  context: AppContext,
  workspaceId: string,
  materialId: string,
  userId: string,
  body: z.output<typeof createTestCutRequestSchema>,
  photo: UploadedPhoto | undefined,
): Promise<TestCut> {
  const photoType = photo ? checkPhoto(photo) : null
  const id = await context.db.transaction(async (tx) => {
    await requireMaterial(tx, workspaceId, materialId, userId)
    const recipe = await materialsRepo.findRecipe(tx, materialId, body.toolKind)
    if (!recipe) throw invalidField('body.toolKind', `This material has no ${body.toolKind} recipe yet: add one before logging a test cut`)
    const settings = await settingsOf(tx, workspaceId)
    const cut: RecipeValues = { ...recipeValuesOf(recipe) }
    for (const field of ['bladeType', 'bladeAngleDeg', 'force', 'passes', 'speedMmS', 'powerPercent'] as const) {
      const value = body[field]
      if (value === undefined) continue
      if (cut[field] === null) throw invalidField(`body.${field}`, `A ${body.toolKind} recipe has no ${field}`)
      ;(cut as Record<string, unknown>)[field] = value
    }
    const machine = await cutterAndBladeOf(tx, workspaceId, body)
    if (body.toolKind === 'blade') {
      const range = effectiveForceRange({ min: settings.forceMin, max: settings.forceMax }, machine.cutterMaxForce)
      checkForce(cut.force, range, machine.cutterMaxForce === undefined ? workspaceRangeName : "the cutter's range")
    }
    const inserted = await repo.insertTestCut(tx, {
      workspaceId,
      materialId,
      toolKind: body.toolKind,
      recipe: cut,
      recipeVersion: recipe.version,
      cutterId: machine.cutterId,
      bladeId: machine.bladeId,
      cutterMaxForce: machine.cutterMaxForce ?? null,
      outcome: body.outcome,
      note: body.note,
      createdBy: userId,
    })
    if (photo && photoType) await repo.insertPhoto(tx, { testCutId: inserted.id, workspaceId, contentType: photoType, byteSize: photo.buffer.length, data: photo.buffer })
    return inserted.id
  })
  return getTestCut(context, workspaceId, materialId, id)
}

/**
 * Applies a test cut's suggestion to the recipe in one step and records it in the history with the test cut named.
 * Refused (409) when already applied, when there is nothing to change, or when the recipe changed after the cut:
 * a suggestion is only as good as the recipe it was made from.
 */
export async function applySuggestion(context: AppContext, workspaceId: string, materialId: string, testCutId: string, userId: string): Promise<ApplySuggestionResponse> {
  const changes = await context.db.transaction(async (tx) => {
    await requireMaterial(tx, workspaceId, materialId, userId)
    const testCut = await repo.lockTestCut(tx, workspaceId, materialId, testCutId)
    if (!testCut) throw notFound('Test cut')
    const recipe = await materialsRepo.findRecipe(tx, materialId, testCut.toolKind, true)
    const settings = await settingsOf(tx, workspaceId)
    const suggestion = suggestionFor(testCut, settings)
    const blocked = applyBlockedReason(testCut, suggestion.changes.length, recipe)
    if (blocked) throw conflict(blocked)
    const next: Partial<RecipeValues> = Object.fromEntries(suggestion.changes.map((change) => [change.field, change.to]))
    const day = testCut.createdAt.toISOString().slice(0, 10)
    const reason = `Suggestion of the test cut of ${day} (${outcomeWords[testCut.outcome]}): ${describeChanges(suggestion.changes)}`
    const written = await writeRecipeValues(tx, recipe!, next, { workspaceId, userId, source: 'suggestion', reason, testCutId })
    await repo.markSuggestionApplied(tx, testCutId, userId, written.recipe.updatedAt)
    return written.changes
  })
  const [material, testCut] = await Promise.all([requireMaterial(context.db, workspaceId, materialId, userId), getTestCut(context, workspaceId, materialId, testCutId)])
  const recipes = await materialsRepo.recipesOf(context.db, [materialId])
  const recipe = recipes.find((entry) => entry.recipe.toolKind === testCut.toolKind)!
  return {
    recipe: toRecipe(recipe.recipe, recipe.updatedByName, material.material.catalogueKey),
    testCut,
    changes: changes.map((change) => toChange(change, recipe.updatedByName)),
  }
}

export async function deleteTestCut(context: AppContext, workspaceId: string, materialId: string, testCutId: string): Promise<void> {
  const deleted = await repo.deleteTestCut(context.db, workspaceId, materialId, testCutId)
  if (!deleted) throw notFound('Test cut')
}

export async function getPhoto(context: AppContext, workspaceId: string, materialId: string, testCutId: string) {
  const photo = await repo.findPhoto(context.db, workspaceId, materialId, testCutId)
  if (!photo) throw notFound('Photo')
  return photo
}
