import { ref } from 'vue'
import { defineStore } from 'pinia'
import type { DesignSummary } from '../../../shared/schemas/index'
import { isApiError } from '../../api/ApiError'
import * as designsApi from '../designs/api'
import { summaryOf } from '../designs/store'

/** How many designs the picker lists at once; the library search narrows them. */
export const PICKER_PAGE_SIZE = 50

/**
 * The designs nest runs refer to, by id, for one workspace: names, previews and piece counts for the form,
 * the progress figures and the result's legend. Filled by the picker's searches and, for runs opened from the
 * list, by fetching the designs not seen yet.
 */
export const useNestDesignsStore = defineStore('nestDesigns', () => {
  const workspaceId = ref<string | null>(null)
  const byId = ref<Record<string, DesignSummary>>({})
  /** Designs a run names that are no longer in the library. */
  const gone = ref<Record<string, true>>({})
  /** Designs in the whole library; null until the first unfiltered answer. */
  const libraryTotal = ref<number | null>(null)

  function switchTo(forWorkspaceId: string): void {
    if (workspaceId.value === forWorkspaceId) return
    workspaceId.value = forWorkspaceId
    byId.value = {}
    gone.value = {}
    libraryTotal.value = null
  }

  function remember(forWorkspaceId: string, designs: readonly DesignSummary[]): void {
    if (workspaceId.value !== forWorkspaceId) return
    const next = { ...byId.value }
    for (const design of designs) next[design.id] = design
    byId.value = next
  }

  /** A page of the library for the picker; an empty search also tells whether the library has any design. */
  async function search(forWorkspaceId: string, text: string): Promise<DesignSummary[]> {
    switchTo(forWorkspaceId)
    const answer = await designsApi.listDesigns(forWorkspaceId, { search: text.trim() || undefined, page: 1, pageSize: PICKER_PAGE_SIZE })
    remember(forWorkspaceId, answer.items)
    if (!text.trim() && workspaceId.value === forWorkspaceId) libraryTotal.value = answer.total
    return answer.items
  }

  /** Fetches the designs not known yet; one that is gone is marked so, anything else is thrown. */
  async function ensure(forWorkspaceId: string, designIds: readonly string[]): Promise<void> {
    switchTo(forWorkspaceId)
    const missing = [...new Set(designIds)].filter((id) => !byId.value[id] && !gone.value[id])
    await Promise.all(
      missing.map(async (designId) => {
        try {
          const design = await designsApi.getDesign(forWorkspaceId, designId)
          remember(forWorkspaceId, [summaryOf(design)])
        } catch (error) {
          if (isApiError(error) && error.status === 404) gone.value = { ...gone.value, [designId]: true }
          else throw error
        }
      }),
    )
  }

  return { workspaceId, byId, gone, libraryTotal, switchTo, remember, search, ensure }
})
