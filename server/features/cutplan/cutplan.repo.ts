import { and, eq, inArray } from 'drizzle-orm'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { designs } from '../../db/schema/index.js'

/** Geometry and names of the designs a layout uses; designs of other workspaces are never found. */
export async function findDesignsForCutPlan(db: DatabaseOrTransaction, workspaceId: string, designIds: string[]) {
  if (designIds.length === 0) return []
  return db
    .select({ id: designs.id, name: designs.name, geometry: designs.geometry })
    .from(designs)
    .where(and(eq(designs.workspaceId, workspaceId), inArray(designs.id, designIds)))
}
