import { and, eq, inArray } from 'drizzle-orm'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { designs, materialRecipes, materials } from '../../db/schema/index.js'

/** Geometry and names of the designs a layout uses; designs of other workspaces are never found. */
export async function findDesignsForCutPlan(db: DatabaseOrTransaction, workspaceId: string, designIds: string[]) {
  if (designIds.length === 0) return []
  return db
    .select({ id: designs.id, name: designs.name, geometry: designs.geometry })
    .from(designs)
    .where(and(eq(designs.workspaceId, workspaceId), inArray(designs.id, designIds)))
}

/** A material of the workspace and its recipe for one tool kind (null when the material has none for that tool). */
export async function findMaterialWithRecipe(db: DatabaseOrTransaction, workspaceId: string, materialId: string, toolKind: 'blade' | 'laser') {
  const [row] = await db
    .select({ name: materials.name, recipe: materialRecipes })
    .from(materials)
    .leftJoin(materialRecipes, and(eq(materialRecipes.materialId, materials.id), eq(materialRecipes.toolKind, toolKind)))
    .where(and(eq(materials.workspaceId, workspaceId), eq(materials.id, materialId)))
  return row
}
