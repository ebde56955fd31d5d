import { ref, watch, type Ref } from 'vue'
import type { MaterialSummary } from '../../../../shared/schemas/index'
import * as materialsApi from '../api'

/**
 * Every active material of a workspace for a picker, favourites first (the server sorts them so), then by name.
 * A workspace keeps tens of materials, so one page of 100 holds them all.
 */
export function useMaterialOptions(workspaceId: Ref<string>) {
  const materials = ref<MaterialSummary[]>([])
  const loading = ref(false)
  const failed = ref(false)
  let latestRequest = 0

  async function load(): Promise<void> {
    const ticket = ++latestRequest
    loading.value = true
    failed.value = false
    try {
      const answer = await materialsApi.listMaterials(workspaceId.value, { status: 'active', page: 1, pageSize: 100 })
      if (ticket === latestRequest) materials.value = answer.items
    } catch {
      if (ticket === latestRequest) failed.value = true
    } finally {
      if (ticket === latestRequest) loading.value = false
    }
  }

  watch(workspaceId, () => void load(), { immediate: true })
  return { materials, loading, failed, load }
}
