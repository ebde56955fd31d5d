import { ref } from 'vue'
import { defineStore } from 'pinia'
import type { MaterialCategory, MaterialSummary } from '../../../shared/schemas/index'
import * as materialsApi from './api'

export const MATERIAL_PAGE_SIZE = 30

export interface MaterialListView {
  search: string
  category: MaterialCategory | ''
  status: 'active' | 'archived' | 'all'
  page: number
}

export const noMaterialFilter: MaterialListView = { search: '', category: '', status: 'active', page: 1 }

const sameView = (a: MaterialListView, b: MaterialListView) => a.search === b.search && a.category === b.category && a.status === b.status && a.page === b.page

/** The materials list of one workspace as the materials page last asked for it. */
export const useMaterialsStore = defineStore('materials', () => {
  const workspaceId = ref<string | null>(null)
  const view = ref<MaterialListView>({ ...noMaterialFilter })
  const items = ref<MaterialSummary[]>([])
  const total = ref(0)
  const loading = ref(false)
  const loaded = ref(false)
  const failed = ref(false)
  let latestRequest = 0

  async function load(forWorkspaceId: string, nextView: MaterialListView): Promise<void> {
    const ticket = ++latestRequest
    if (workspaceId.value !== forWorkspaceId) {
      items.value = []
      total.value = 0
    }
    if (!(workspaceId.value === forWorkspaceId && sameView(view.value, nextView))) loaded.value = false
    workspaceId.value = forWorkspaceId
    view.value = { ...nextView }
    loading.value = true
    failed.value = false
    try {
      const answer = await materialsApi.listMaterials(forWorkspaceId, { ...nextView, pageSize: MATERIAL_PAGE_SIZE })
      if (ticket !== latestRequest) return
      items.value = answer.items
      total.value = answer.total
      loaded.value = true
    } catch (error) {
      if (ticket === latestRequest) failed.value = true
      throw error
    } finally {
      if (ticket === latestRequest) loading.value = false
    }
  }

  /** Stars or unstars at once; the list is re-read afterwards so favourites move to the top. */
  async function setFavourite(forWorkspaceId: string, materialId: string, favourite: boolean): Promise<void> {
    const mark = (value: boolean) => {
      items.value = items.value.map((item) => (item.id === materialId ? { ...item, isFavourite: value } : item))
    }
    mark(favourite)
    try {
      if (favourite) await materialsApi.addFavourite(forWorkspaceId, materialId)
      else await materialsApi.removeFavourite(forWorkspaceId, materialId)
    } catch (error) {
      mark(!favourite)
      throw error
    }
  }

  function lastViewFor(forWorkspaceId: string): MaterialListView {
    return workspaceId.value === forWorkspaceId ? view.value : noMaterialFilter
  }

  return { workspaceId, view, items, total, loading, loaded, failed, load, setFavourite, lastViewFor }
})
