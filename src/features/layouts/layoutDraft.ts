import { z } from 'zod'
import type { LayoutDocument } from '../../../shared/layout/document'
import { layoutBodySchema } from '../../../shared/schemas/layouts'

/**
 * Unsaved edits kept in this browser's localStorage, one entry per layout, so a closed tab or a crash loses nothing.
 * The entry holds the saved version the edits started from (`base`), so they can be re-applied on a newer one.
 */
export interface LayoutDraft {
  baseVersion: number
  base: LayoutDocument
  document: LayoutDocument
  /** ISO time of the last edit. */
  savedAt: string
}

const draftSchema = z.object({
  baseVersion: z.number().int(),
  base: layoutBodySchema,
  document: layoutBodySchema,
  savedAt: z.string(),
})

const keyFor = (workspaceId: string, layoutId: string) => `sheetsmith:layout-draft:${workspaceId}:${layoutId}`

export function readDraft(workspaceId: string, layoutId: string): LayoutDraft | null {
  try {
    const text = localStorage.getItem(keyFor(workspaceId, layoutId))
    if (!text) return null
    const parsed = draftSchema.safeParse(JSON.parse(text))
    // A draft this version of the editor cannot read is of no use to anyone: drop it.
    if (!parsed.success) {
      localStorage.removeItem(keyFor(workspaceId, layoutId))
      return null
    }
    return parsed.data
  } catch {
    return null
  }
}

/** False when the browser refuses (storage full or switched off); the editor then says the draft is not kept. */
export function writeDraft(workspaceId: string, layoutId: string, draft: LayoutDraft): boolean {
  try {
    localStorage.setItem(keyFor(workspaceId, layoutId), JSON.stringify(draft))
    return true
  } catch {
    return false
  }
}

export function clearDraft(workspaceId: string, layoutId: string): void {
  try {
    localStorage.removeItem(keyFor(workspaceId, layoutId))
  } catch {
    // Storage switched off: there is nothing to clear.
  }
}
