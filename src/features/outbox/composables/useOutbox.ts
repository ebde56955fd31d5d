import { onBeforeUnmount, ref, watch, type Ref } from 'vue'
import type { OutboxMessage } from '../../../../shared/schemas/index'
import { isApiError } from '../../../api/ApiError'
import { emptyOutbox, listOutbox } from '../api'

export const OUTBOX_POLL_MS = 3000

/**
 * The caught messages, polled while `autoRefresh` is on and the tab is visible.
 * `off` means the server has no mail catcher (it answers 404), so polling stops.
 */
export function useOutbox(autoRefresh: Ref<boolean>) {
  const messages = ref<OutboxMessage[]>([])
  const status = ref<'idle' | 'loading' | 'ready' | 'off' | 'failed'>('idle')
  const refreshing = ref(false)
  const lastError = ref<unknown>(null)
  const updatedAt = ref<Date | null>(null)

  let timer: ReturnType<typeof setInterval> | null = null

  async function refresh(): Promise<void> {
    if (refreshing.value || status.value === 'off') return
    refreshing.value = true
    if (status.value === 'idle') status.value = 'loading'
    try {
      messages.value = await listOutbox()
      status.value = 'ready'
      updatedAt.value = new Date()
      lastError.value = null
    } catch (error) {
      lastError.value = error
      if (isApiError(error) && error.status === 404) {
        status.value = 'off'
        stopPolling()
      } else if (status.value === 'loading') {
        status.value = 'failed'
      }
      throw error
    } finally {
      refreshing.value = false
    }
  }

  async function empty(): Promise<void> {
    await emptyOutbox()
    messages.value = []
  }

  function startPolling(): void {
    stopPolling()
    timer = setInterval(() => {
      if (document.visibilityState !== 'visible') return
      // Polling failures show as a quiet status line, never as a notification every 3 s.
      refresh().catch(() => {})
    }, OUTBOX_POLL_MS)
  }

  function stopPolling(): void {
    if (timer !== null) clearInterval(timer)
    timer = null
  }

  function markOff(): void {
    status.value = 'off'
    stopPolling()
  }

  watch(autoRefresh, (on) => (on && status.value !== 'off' ? startPolling() : stopPolling()))
  onBeforeUnmount(stopPolling)

  return { messages, status, refreshing, lastError, updatedAt, refresh, empty, startPolling, markOff }
}
