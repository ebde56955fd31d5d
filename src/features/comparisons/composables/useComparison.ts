import { onBeforeUnmount, ref, watch, type Ref } from 'vue'
import type { ComparisonDetail } from '../../../../shared/schemas/comparisons'
import { cancelComparison, getComparison, rerunComparison } from '../api'

const pollIntervalMs = 1000
const active = new Set(['queued', 'running'])

/**
 * One comparison, kept fresh: polled once a second while any of its runs works, then left alone. Owns its loading
 * and error state; `cancel` and `rerun` answer with the comparison as it then stands.
 */
export function useComparison(workspaceId: Ref<string>, comparisonId: Ref<string>, onError: (error: unknown, fallback: string) => void) {
  const comparison = ref<ComparisonDetail | null>(null)
  const loading = ref(false)
  const missing = ref(false)
  const busy = ref<'cancel' | 'rerun' | null>(null)
  let timer: ReturnType<typeof setTimeout> | undefined
  let generation = 0

  function schedule(): void {
    clearTimeout(timer)
    if (comparison.value && active.has(comparison.value.status)) timer = setTimeout(() => void load(true), pollIntervalMs)
  }

  async function load(quiet = false): Promise<void> {
    const asked = ++generation
    if (!quiet) loading.value = true
    try {
      const found = await getComparison(workspaceId.value, comparisonId.value)
      if (asked !== generation) return
      comparison.value = found
      missing.value = false
    } catch (error) {
      if (asked !== generation) return
      if ((error as { status?: number }).status === 404) missing.value = true
      else onError(error, 'Could not load the comparison.')
    } finally {
      if (asked === generation) {
        loading.value = false
        schedule()
      }
    }
  }

  async function act(kind: 'cancel' | 'rerun'): Promise<void> {
    if (busy.value) return
    busy.value = kind
    try {
      comparison.value = kind === 'cancel' ? await cancelComparison(workspaceId.value, comparisonId.value) : await rerunComparison(workspaceId.value, comparisonId.value)
      schedule()
    } catch (error) {
      onError(error, kind === 'cancel' ? 'Could not cancel the comparison.' : 'Could not run the comparison again.')
    } finally {
      busy.value = null
    }
  }

  watch([workspaceId, comparisonId], () => {
    comparison.value = null
    void load()
  }, { immediate: true })
  onBeforeUnmount(() => {
    generation++
    clearTimeout(timer)
  })

  return { comparison, loading, missing, busy, reload: load, cancel: () => act('cancel'), rerun: () => act('rerun') }
}
