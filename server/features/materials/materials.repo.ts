import { and, asc, count, desc, eq, ilike, inArray, isNotNull, isNull, or, sql, type SQL } from 'drizzle-orm'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { materialFavourites, materialRecipes, materials, materialSettings, recipeChanges, stockItems, testCuts, users } from '../../db/schema/index.js'

export type MaterialRow = typeof materials.$inferSelect
export type NewMaterialRow = typeof materials.$inferInsert
export type RecipeRow = typeof materialRecipes.$inferSelect
export type NewRecipeRow = typeof materialRecipes.$inferInsert
export type SettingsRow = typeof materialSettings.$inferSelect

export interface MaterialFilter {
  search?: string
  category?: string
  status: 'active' | 'archived' | 'all'
  favouritesOnly?: boolean
  page: number
  pageSize: number
}

const likePattern = (text: string) => `%${text.replace(/[\\%_]/g, (match) => `\\${match}`)}%`

/** Whether the person starred the material, as a column: favourites sort first in every list. */
const favouriteFor = (userId: string) =>
  sql<boolean>`exists (select 1 from ${materialFavourites} where ${materialFavourites.materialId} = ${materials.id} and ${materialFavourites.userId} = ${userId})`

function listFilter(workspaceId: string, userId: string, filter: MaterialFilter): SQL | undefined {
  const conditions: SQL[] = [eq(materials.workspaceId, workspaceId)]
  if (filter.search) {
    const pattern = likePattern(filter.search)
    conditions.push(or(ilike(materials.name, pattern), ilike(materials.description, pattern), ilike(materials.category, pattern))!)
  }
  if (filter.category) conditions.push(eq(materials.category, filter.category))
  if (filter.status === 'active') conditions.push(isNull(materials.archivedAt))
  if (filter.status === 'archived') conditions.push(isNotNull(materials.archivedAt))
  if (filter.favouritesOnly) conditions.push(favouriteFor(userId))
  return and(...conditions)
}

export async function listMaterials(db: DatabaseOrTransaction, workspaceId: string, userId: string, filter: MaterialFilter) {
  const where = listFilter(workspaceId, userId, filter)
  const isFavourite = favouriteFor(userId)
  const [rows, [total]] = await Promise.all([
    db
      .select({ material: materials, isFavourite })
      .from(materials)
      .where(where)
      .orderBy(desc(isFavourite), asc(materials.name), asc(materials.id))
      .limit(filter.pageSize)
      .offset((filter.page - 1) * filter.pageSize),
    db.select({ value: count() }).from(materials).where(where),
  ])
  return { rows, total: total?.value ?? 0 }
}

export async function findMaterial(db: DatabaseOrTransaction, workspaceId: string, materialId: string, userId: string) {
  const [row] = await db
    .select({ material: materials, isFavourite: favouriteFor(userId) })
    .from(materials)
    .where(and(eq(materials.workspaceId, workspaceId), eq(materials.id, materialId)))
  return row
}

export async function insertMaterial(db: DatabaseOrTransaction, row: NewMaterialRow) {
  const [inserted] = await db.insert(materials).values(row).returning({ id: materials.id })
  return inserted!
}

/** Catalogue copies; an entry the workspace already holds (same key) is left alone, so concurrent first visits are safe. */
export async function insertCatalogueMaterials(db: DatabaseOrTransaction, rows: NewMaterialRow[]) {
  if (rows.length === 0) return []
  return db
    .insert(materials)
    .values(rows)
    .onConflictDoNothing({ target: [materials.workspaceId, materials.catalogueKey] })
    .returning({ id: materials.id, catalogueKey: materials.catalogueKey })
}

export async function updateMaterial(db: DatabaseOrTransaction, workspaceId: string, materialId: string, changes: Partial<NewMaterialRow>) {
  const [row] = await db
    .update(materials)
    .set({ ...changes, updatedAt: new Date() })
    .where(and(eq(materials.workspaceId, workspaceId), eq(materials.id, materialId)))
    .returning({ id: materials.id })
  return row
}

export async function deleteMaterial(db: DatabaseOrTransaction, workspaceId: string, materialId: string) {
  const [row] = await db
    .delete(materials)
    .where(and(eq(materials.workspaceId, workspaceId), eq(materials.id, materialId)))
    .returning({ id: materials.id })
  return row
}

export async function usageCounts(db: DatabaseOrTransaction, materialId: string) {
  const [[stock], [cuts]] = await Promise.all([
    db.select({ value: count() }).from(stockItems).where(eq(stockItems.materialId, materialId)),
    db.select({ value: count() }).from(testCuts).where(eq(testCuts.materialId, materialId)),
  ])
  return { stockCount: stock?.value ?? 0, testCutCount: cuts?.value ?? 0 }
}

// Recipes

const recipeColumns = { recipe: materialRecipes, updatedByName: users.name }
export type RecipeWithAuthor = { recipe: RecipeRow; updatedByName: string | null }

export async function recipesOf(db: DatabaseOrTransaction, materialIds: string[]): Promise<RecipeWithAuthor[]> {
  if (materialIds.length === 0) return []
  return db
    .select(recipeColumns)
    .from(materialRecipes)
    .leftJoin(users, eq(users.id, materialRecipes.updatedBy))
    .where(inArray(materialRecipes.materialId, materialIds))
    .orderBy(asc(materialRecipes.toolKind))
}

/** The recipe row, locked for the rest of the transaction when `forUpdate`, so two tuning steps cannot interleave. */
export async function findRecipe(db: DatabaseOrTransaction, materialId: string, toolKind: 'blade' | 'laser', forUpdate = false): Promise<RecipeRow | undefined> {
  const query = db
    .select()
    .from(materialRecipes)
    .where(and(eq(materialRecipes.materialId, materialId), eq(materialRecipes.toolKind, toolKind)))
  const [row] = forUpdate ? await query.for('update') : await query
  return row
}

export async function insertRecipes(db: DatabaseOrTransaction, rows: NewRecipeRow[]) {
  if (rows.length === 0) return []
  return db
    .insert(materialRecipes)
    .values(rows)
    .onConflictDoNothing({ target: [materialRecipes.materialId, materialRecipes.toolKind] })
    .returning()
}

/** Writes changed values and raises the version by one. */
export async function updateRecipe(db: DatabaseOrTransaction, recipeId: string, changes: Partial<NewRecipeRow>) {
  const [row] = await db
    .update(materialRecipes)
    .set({ updatedAt: new Date(), ...changes, version: sql`${materialRecipes.version} + 1` })
    .where(eq(materialRecipes.id, recipeId))
    .returning()
  return row!
}

export async function deleteRecipe(db: DatabaseOrTransaction, materialId: string, toolKind: 'blade' | 'laser') {
  const [row] = await db
    .delete(materialRecipes)
    .where(and(eq(materialRecipes.materialId, materialId), eq(materialRecipes.toolKind, toolKind)))
    .returning({ id: materialRecipes.id })
  return row
}

// Settings

export async function findSettings(db: DatabaseOrTransaction, workspaceId: string): Promise<SettingsRow | undefined> {
  const [row] = await db.select().from(materialSettings).where(eq(materialSettings.workspaceId, workspaceId))
  return row
}

export async function upsertSettings(db: DatabaseOrTransaction, workspaceId: string, changes: Partial<Omit<SettingsRow, 'workspaceId'>>) {
  const [row] = await db
    .insert(materialSettings)
    .values({ workspaceId, ...changes })
    .onConflictDoUpdate({ target: materialSettings.workspaceId, set: { ...changes, updatedAt: new Date() } })
    .returning()
  return row!
}

// Favourites

export async function favouriteIds(db: DatabaseOrTransaction, workspaceId: string, userId: string): Promise<string[]> {
  const rows = await db
    .select({ materialId: materialFavourites.materialId })
    .from(materialFavourites)
    .innerJoin(materials, eq(materials.id, materialFavourites.materialId))
    .where(and(eq(materialFavourites.workspaceId, workspaceId), eq(materialFavourites.userId, userId)))
    .orderBy(asc(materials.name))
  return rows.map((row) => row.materialId)
}

export async function addFavourite(db: DatabaseOrTransaction, workspaceId: string, userId: string, materialId: string) {
  await db.insert(materialFavourites).values({ workspaceId, userId, materialId }).onConflictDoNothing()
}

export async function removeFavourite(db: DatabaseOrTransaction, userId: string, materialId: string) {
  await db.delete(materialFavourites).where(and(eq(materialFavourites.userId, userId), eq(materialFavourites.materialId, materialId)))
}

// Recipe history

export type NewRecipeChangeRow = typeof recipeChanges.$inferInsert
export type RecipeChangeRow = typeof recipeChanges.$inferSelect

export async function insertRecipeChanges(db: DatabaseOrTransaction, rows: NewRecipeChangeRow[]) {
  if (rows.length === 0) return []
  return db.insert(recipeChanges).values(rows).returning()
}

export async function listRecipeChanges(
  db: DatabaseOrTransaction,
  materialId: string,
  filter: { toolKind?: 'blade' | 'laser'; page: number; pageSize: number },
) {
  const conditions: SQL[] = [eq(recipeChanges.materialId, materialId)]
  if (filter.toolKind) conditions.push(eq(recipeChanges.toolKind, filter.toolKind))
  const where = and(...conditions)
  const [rows, [total]] = await Promise.all([
    db
      .select({ change: recipeChanges, changedByName: users.name })
      .from(recipeChanges)
      .leftJoin(users, eq(users.id, recipeChanges.changedBy))
      .where(where)
      // Fields changed in one step share a timestamp; keep them in the order of the recipe's fields.
      .orderBy(desc(recipeChanges.changedAt), asc(recipeChanges.field))
      .limit(filter.pageSize)
      .offset((filter.page - 1) * filter.pageSize),
    db.select({ value: count() }).from(recipeChanges).where(where),
  ])
  return { rows, total: total?.value ?? 0 }
}
