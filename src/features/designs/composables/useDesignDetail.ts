import { ref, watch, type Ref } from 'vue'
import { isApiError } from '../../../api/ApiError'
import type { DesignDetail, UpdateDesignRequest } from '../../../../shared/schemas/index'
import * as designsApi from '../api'
import { useDesignsStore } from '../store'

/** A design that is gone, belongs elsewhere, or whose id is not even an id: all look the same. */
export function isMissingDesign(error: unknown): boolean {
  if (!isApiError(error)) return false
  if (error.status === 404) return true
  return error.status === 400 && Object.keys(error.fields).some((field) => field.startsWith('params.'))
}

/**
 * One design with its geometry, loaded whenever the route's ids change. Changes go through here so
 * the library grid stays in step without another round trip.
 */
export function useDesignDetail(workspaceId: Ref<string>, designId: Ref<string>, onError: (error: unknown) => void) {
  const store = useDesignsStore()
  const design = ref<DesignDetail | null>(null)
  const loading = ref(false)
  const missing = ref(false)
  const failed = ref(false)
  let latestRequest = 0

  async function load(): Promise<void> {
    const ticket = ++latestRequest
    const forWorkspaceId = workspaceId.value
    const forDesignId = designId.value
    if (design.value?.id !== forDesignId) design.value = null
    loading.value = true
    missing.value = false
    failed.value = false
    try {
      const answer = await designsApi.getDesign(forWorkspaceId, forDesignId)
      if (ticket === latestRequest) design.value = answer
    } catch (error) {
      if (ticket !== latestRequest) return
      if (isMissingDesign(error)) missing.value = true
      else {
        failed.value = true
        onError(error)
      }
    } finally {
      if (ticket === latestRequest) loading.value = false
    }
  }

  async function update(changes: UpdateDesignRequest): Promise<DesignDetail> {
    const updated = await designsApi.updateDesign(workspaceId.value, designId.value, changes)
    if (design.value?.id === updated.id) design.value = updated
    store.applyUpdate(updated)
    return updated
  }

  async function remove(): Promise<void> {
    const removedId = designId.value
    await designsApi.deleteDesign(workspaceId.value, removedId)
    store.forget(removedId)
  }

  watch([workspaceId, designId], () => void load(), { immediate: true })

  return { design, loading, missing, failed, load, update, remove }
}
