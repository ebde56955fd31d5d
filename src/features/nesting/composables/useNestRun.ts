import { onScopeDispose, ref, watch, type Ref } from 'vue'
import { isApiError } from '../../../api/ApiError'
import type { CreateNestRunRequest, NestRunDto, NestRunStatus } from '../../../../shared/schemas/index'
import * as nestingApi from '../api'

/** How the page hears about a run that is still working. */
export type NestRunConnection = 'idle' | 'stream' | 'polling' | 'reconnecting'

const POLL_INTERVAL_MS = 1000
const MAX_POLL_BACKOFF_MS = 8000

export function isFinished(status: NestRunStatus): boolean {
  return status === 'succeeded' || status === 'failed' || status === 'cancelled'
}

/** A run that is gone, belongs to another workspace, or whose id is not even an id: all look the same. */
export function isMissingRun(error: unknown): boolean {
  if (!isApiError(error)) return false
  if (error.status === 404) return true
  return error.status === 400 && Object.keys(error.fields).some((field) => field.startsWith('params.'))
}

/** Resolves after `milliseconds`, or at once when the signal aborts. */
function pause(milliseconds: number, signal: AbortSignal): Promise<void> {
  return new Promise((resolve) => {
    if (signal.aborted) return resolve()
    const timer = setTimeout(done, milliseconds)
    function done(): void {
      clearTimeout(timer)
      signal.removeEventListener('abort', done)
      resolve()
    }
    signal.addEventListener('abort', done, { once: true })
  })
}

export interface NestRunHandlers {
  onError: (error: unknown, fallback: string) => void
  /** Every new state of the shown run (start, progress, finish), e.g. to keep the recent list in step. */
  onChange?: (run: NestRunDto) => void
}

/**
 * The run the page shows (the route's `?run=`): loaded once, then followed while it works through its server-sent
 * events, or by asking every second when the stream cannot be opened or breaks. Owns starting and cancelling.
 */
export function useNestRun(workspaceId: Ref<string>, runId: Ref<string | null>, handlers: NestRunHandlers) {
  const run = ref<NestRunDto | null>(null)
  const loading = ref(false)
  const missing = ref(false)
  const stopping = ref(false)
  const connection = ref<NestRunConnection>('idle')
  let controller: AbortController | null = null
  let latestOpen = 0

  function stopFollowing(): void {
    controller?.abort()
    controller = null
    connection.value = 'idle'
  }

  function show(next: NestRunDto): void {
    run.value = next
    if (isFinished(next.status)) stopping.value = false
    handlers.onChange?.(next)
  }

  async function poll(forWorkspaceId: string, id: string, mine: AbortController): Promise<void> {
    connection.value = 'polling'
    let failures = 0
    while (!mine.signal.aborted) {
      await pause(failures === 0 ? POLL_INTERVAL_MS : Math.min(MAX_POLL_BACKOFF_MS, POLL_INTERVAL_MS * 2 ** failures), mine.signal)
      if (mine.signal.aborted) return
      try {
        const next = await nestingApi.getNestRun(forWorkspaceId, id)
        if (mine.signal.aborted) return
        failures = 0
        connection.value = 'polling'
        show(next)
        if (isFinished(next.status)) {
          connection.value = 'idle'
          return
        }
      } catch (error) {
        if (mine.signal.aborted) return
        if (isMissingRun(error)) {
          missing.value = true
          connection.value = 'idle'
          return
        }
        failures += 1
        connection.value = 'reconnecting'
        // Once is enough: the panel says it keeps trying, and a notice every few seconds would bury the page.
        if (failures === 1) handlers.onError(error, 'Lost touch with the nest run. Still trying…')
      }
    }
  }

  async function follow(forWorkspaceId: string, id: string): Promise<void> {
    stopFollowing()
    const mine = new AbortController()
    controller = mine
    connection.value = 'stream'
    try {
      const sawDone = await nestingApi.followNestRunEvents(
        forWorkspaceId,
        id,
        {
          onProgress: (update) => {
            if (mine.signal.aborted || run.value?.id !== id) return
            show({ ...run.value, status: update.status, progress: update.progress ?? run.value.progress })
          },
          onDone: (finished) => {
            if (!mine.signal.aborted && finished.id === id) show(finished)
          },
        },
        mine.signal,
      )
      if (mine.signal.aborted) return
      if (sawDone) {
        connection.value = 'idle'
        return
      }
    } catch (error) {
      if (mine.signal.aborted) return
      if (isMissingRun(error)) {
        missing.value = true
        connection.value = 'idle'
        return
      }
      // Anything else (a proxy that buffers, a dropped connection, an answer we could not read): ask instead.
    }
    await poll(forWorkspaceId, id, mine)
  }

  async function open(id: string | null): Promise<void> {
    const ticket = ++latestOpen
    stopFollowing()
    stopping.value = false
    missing.value = false
    if (id === null) {
      run.value = null
      loading.value = false
      return
    }
    const forWorkspaceId = workspaceId.value
    // Just started here: the answer to the start is already shown.
    if (run.value?.id === id) {
      loading.value = false
      if (!isFinished(run.value.status)) void follow(forWorkspaceId, id)
      return
    }
    run.value = null
    loading.value = true
    try {
      const answer = await nestingApi.getNestRun(forWorkspaceId, id)
      if (ticket !== latestOpen) return
      show(answer)
      if (!isFinished(answer.status)) void follow(forWorkspaceId, id)
    } catch (error) {
      if (ticket !== latestOpen) return
      if (isMissingRun(error)) missing.value = true
      else handlers.onError(error, 'Could not load the nest run.')
    } finally {
      if (ticket === latestOpen) loading.value = false
    }
  }

  /** Queues a run and shows it at once; the caller puts its id in the address. */
  async function start(request: CreateNestRunRequest, startedByName: string | null): Promise<NestRunDto> {
    const answer = await nestingApi.startNestRun(workspaceId.value, request)
    // The answer to a start does not name who started it; the list and the header should.
    const started = { ...answer, createdByName: answer.createdByName ?? startedByName }
    latestOpen += 1
    stopFollowing()
    missing.value = false
    loading.value = false
    stopping.value = false
    show(started)
    return started
  }

  /** Asks the run to stop; it keeps its best layout so far, and the stream brings the final state. */
  async function cancel(): Promise<void> {
    const current = run.value
    if (!current || isFinished(current.status)) return
    stopping.value = true
    try {
      const answer = await nestingApi.cancelNestRun(workspaceId.value, current.id)
      if (run.value?.id !== answer.id) return
      // The answer may still say `running`; keep the live progress until the final state arrives.
      if (isFinished(answer.status)) show(answer)
    } catch (error) {
      stopping.value = false
      handlers.onError(error, 'Could not stop the nest run.')
    }
  }

  watch([workspaceId, runId], ([, id]) => void open(id), { immediate: true })
  onScopeDispose(stopFollowing)

  return { run, loading, missing, stopping, connection, start, cancel }
}
