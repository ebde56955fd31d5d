import { ref, shallowRef, watch, type Ref } from 'vue'
import type { LayoutSummary } from '../../../../shared/schemas/layouts'
import * as layoutsApi from '../api'

export const LAYOUT_PAGE_SIZE = 24

export type LayoutListKind = 'layouts' | 'templates'

/** One page of the workspace's layouts or templates, as the list page shows it; newer searches win over older ones. */
export function useLayoutList(workspaceId: Ref<string>, kind: Ref<LayoutListKind>, search: Ref<string>, onError: (error: unknown, fallback: string) => void) {
  const items = shallowRef<LayoutSummary[]>([])
  const total = ref(0)
  const page = ref(1)
  const loading = ref(false)
  const loaded = ref(false)
  const failed = ref(false)
  let latest = 0

  async function load(): Promise<void> {
    const ticket = ++latest
    loading.value = true
    failed.value = false
    try {
      const answer = await layoutsApi.listLayouts(workspaceId.value, {
        search: search.value.trim() || undefined,
        templates: kind.value === 'templates' ? 'only' : 'exclude',
        page: page.value,
        pageSize: LAYOUT_PAGE_SIZE,
      })
      if (ticket !== latest) return
      items.value = answer.items
      total.value = answer.total
      loaded.value = true
    } catch (error) {
      if (ticket !== latest) return
      failed.value = true
      onError(error, kind.value === 'templates' ? 'Could not load the templates.' : 'Could not load the layouts.')
    } finally {
      if (ticket === latest) loading.value = false
    }
  }

  function forget(layoutId: string): void {
    items.value = items.value.filter((item) => item.id !== layoutId)
    total.value = Math.max(0, total.value - 1)
  }

  watch([workspaceId, kind, search], () => {
    page.value = 1
    loaded.value = false
    void load()
  })
  watch(page, () => void load())
  void load()

  return { items, total, page, loading, loaded, failed, load, forget }
}
