import { ref, watch, type Ref } from 'vue'
import type { NestRunDto } from '../../../../shared/schemas/index'
import * as nestingApi from '../api'

/** The server keeps the list to this many; a run started here pushes the oldest out the same way. */
const RECENT_LIMIT = 20

/** The workspace's recent nest runs, newest first, kept in step with the run the page follows. */
export function useRecentNestRuns(workspaceId: Ref<string>, onError: (error: unknown, fallback: string) => void) {
  const runs = ref<NestRunDto[]>([])
  const loading = ref(false)
  const loaded = ref(false)
  const failed = ref(false)
  let latest = 0

  async function load(): Promise<void> {
    const ticket = ++latest
    const forWorkspaceId = workspaceId.value
    loading.value = true
    failed.value = false
    try {
      const answer = await nestingApi.listNestRuns(forWorkspaceId)
      if (ticket !== latest) return
      runs.value = answer
      loaded.value = true
    } catch (error) {
      if (ticket !== latest) return
      failed.value = true
      onError(error, 'Could not load the recent nest runs.')
    } finally {
      if (ticket === latest) loading.value = false
    }
  }

  /** A run's newest state replaces its row; a run not listed yet (just started) goes on top. */
  function upsert(run: NestRunDto): void {
    const index = runs.value.findIndex((candidate) => candidate.id === run.id)
    if (index === -1) {
      runs.value = [run, ...runs.value].slice(0, RECENT_LIMIT)
      return
    }
    const next = [...runs.value]
    // The list answer names who started a run; the answer to a start does not yet.
    next[index] = { ...run, createdByName: run.createdByName ?? runs.value[index]!.createdByName }
    runs.value = next
  }

  watch(
    workspaceId,
    () => {
      runs.value = []
      loaded.value = false
      void load()
    },
    { immediate: true },
  )

  return { runs, loading, loaded, failed, load, upsert }
}
