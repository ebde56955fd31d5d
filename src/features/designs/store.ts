import { ref } from 'vue'
import { defineStore } from 'pinia'
import type { DesignDetail, DesignSummary } from '../../../shared/schemas/index'
import * as designsApi from './api'
import { noDesignFilter, sameFilter, type DesignLibraryFilter } from './libraryFilter'

export const DESIGN_PAGE_SIZE = 24

/** A summary from a detail answer: the library must not hold every design's full geometry. */
export function summaryOf(design: DesignDetail | DesignSummary): DesignSummary {
  if (!('geometry' in design)) return design
  const { geometry: _geometry, warnings: _warnings, createdByName: _createdByName, ...summary } = design
  return summary
}

/** The design library of one workspace as the library page last asked for it. */
export const useDesignsStore = defineStore('designs', () => {
  const workspaceId = ref<string | null>(null)
  const filter = ref<DesignLibraryFilter>({ ...noDesignFilter })
  const items = ref<DesignSummary[]>([])
  const total = ref(0)
  /** Every tag used in the workspace, whatever the filter. */
  const tags = ref<string[]>([])
  const loading = ref(false)
  /** An answer for the current workspace and filter has arrived (an empty list is an answer). */
  const loaded = ref(false)
  const failed = ref(false)

  let latestRequest = 0

  async function load(forWorkspaceId: string, nextFilter: DesignLibraryFilter): Promise<void> {
    const ticket = ++latestRequest
    if (workspaceId.value !== forWorkspaceId) {
      items.value = []
      total.value = 0
      tags.value = []
    }
    const sameQuery = workspaceId.value === forWorkspaceId && sameFilter(filter.value, nextFilter)
    if (!sameQuery) loaded.value = false
    workspaceId.value = forWorkspaceId
    filter.value = { ...nextFilter }
    loading.value = true
    failed.value = false
    try {
      const answer = await designsApi.listDesigns(forWorkspaceId, { ...nextFilter, pageSize: DESIGN_PAGE_SIZE })
      // Typing fast sends several searches; only the newest answer may fill the grid.
      if (ticket !== latestRequest) return
      items.value = answer.items
      total.value = answer.total
      tags.value = answer.tags
      loaded.value = true
    } catch (error) {
      if (ticket === latestRequest) failed.value = true
      throw error
    } finally {
      if (ticket === latestRequest) loading.value = false
    }
  }

  /** Keeps the grid in step with a change made on a design's own page. */
  function applyUpdate(design: DesignDetail): void {
    const summary = summaryOf(design)
    items.value = items.value.map((item) => (item.id === summary.id ? summary : item))
    tags.value = [...new Set([...tags.value, ...summary.tags])].sort()
  }

  function forget(designId: string): void {
    const before = items.value.length
    items.value = items.value.filter((item) => item.id !== designId)
    if (items.value.length < before) total.value = Math.max(0, total.value - 1)
  }

  /** The filter to go back to from a design's page, if it belongs to that workspace. */
  function lastFilterFor(forWorkspaceId: string): DesignLibraryFilter {
    return workspaceId.value === forWorkspaceId ? filter.value : noDesignFilter
  }

  return { workspaceId, filter, items, total, tags, loading, loaded, failed, load, applyUpdate, forget, lastFilterFor }
})

