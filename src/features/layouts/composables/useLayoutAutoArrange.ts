import { onScopeDispose, ref, shallowRef, type Ref } from 'vue'
import { arrangementFromNestResult, nestRequestFromLayout } from '../../../../shared/layout/autoArrange'
import type { NestProgressDto, NestRunDto } from '../../../../shared/schemas/index'
import * as nestingApi from '../../nesting/api'
import { isFinished } from '../../nesting/composables/useNestRun'
import { newPlacementId } from '../layoutDocument'
import type { LayoutEditor, LayoutEditorHandlers } from './useLayoutEditor'

const POLL_INTERVAL_MS = 1000

/**
 * Auto-arrange: a nest run of the layout's unlocked pieces on its stock, followed over server-sent events (or by
 * asking every second), whose result replaces the unlocked pieces. Editing waits while it runs. Stopping keeps the
 * best arrangement found so far; cancelling leaves the layout as it was.
 */
export function useLayoutAutoArrange(editor: LayoutEditor, workspaceId: Ref<string>, handlers: LayoutEditorHandlers) {
  const run = shallowRef<NestRunDto | null>(null)
  const progress = shallowRef<NestProgressDto | null>(null)
  const active = ref(false)
  const stopping = ref(false)
  /** How many locked pieces stay where they are in the current run. */
  const lockedCount = ref(0)
  let outcome: 'apply' | 'discard' = 'apply'
  let controller: AbortController | null = null

  function finish(finished: NestRunDto): void {
    controller?.abort()
    controller = null
    run.value = finished
    active.value = false
    stopping.value = false
    editor.busy.value = false
    const document = editor.document.value
    if (outcome === 'discard') {
      handlers.onInfo('Auto-arrange cancelled: the layout is as it was.')
      return
    }
    if (finished.status === 'failed') {
      handlers.onError(null, finished.error ? `Auto-arrange failed: ${finished.error}` : 'Auto-arrange failed.')
      return
    }
    if (!finished.result || !document) {
      handlers.onInfo('Auto-arrange stopped before it placed anything: the layout is as it was.')
      return
    }
    const arranged = arrangementFromNestResult(document, finished.result, { shapes: editor.shapes(), newId: newPlacementId })
    editor.applyArrangement(arranged.placements, arranged.stock)
    const unplaced = finished.result.unplaced.length
    handlers.onInfo(unplaced > 0 ? `Arranged, but ${unplaced} piece${unplaced === 1 ? '' : 's'} did not fit: add stock or fewer copies.` : 'Arranged. Undo brings the previous arrangement back.')
  }

  async function poll(runId: string, mine: AbortController): Promise<void> {
    while (!mine.signal.aborted) {
      await new Promise((resolve) => setTimeout(resolve, POLL_INTERVAL_MS))
      if (mine.signal.aborted) return
      try {
        const next = await nestingApi.getNestRun(workspaceId.value, runId)
        if (mine.signal.aborted) return
        progress.value = next.progress ?? progress.value
        if (isFinished(next.status)) return finish(next)
      } catch {
        // The next round asks again; the panel keeps showing the last progress.
      }
    }
  }

  async function follow(runId: string): Promise<void> {
    const mine = new AbortController()
    controller = mine
    try {
      const sawDone = await nestingApi.followNestRunEvents(
        workspaceId.value,
        runId,
        {
          onProgress: (update) => {
            if (!mine.signal.aborted) progress.value = update.progress ?? progress.value
          },
          onDone: (finished) => {
            if (!mine.signal.aborted) finish(finished)
          },
        },
        mine.signal,
      )
      if (sawDone || mine.signal.aborted) return
    } catch {
      if (mine.signal.aborted) return
    }
    await poll(runId, mine)
  }

  async function start(timeBudgetSeconds: number): Promise<void> {
    const document = editor.document.value
    if (!document || active.value || !editor.editable.value) return
    const built = nestRequestFromLayout(document, { designs: editor.designMap, shapes: editor.shapes() }, timeBudgetSeconds)
    if (!built.request) {
      handlers.onInfo(built.reason)
      return
    }
    outcome = 'apply'
    lockedCount.value = built.lockedCount
    progress.value = null
    active.value = true
    editor.busy.value = true
    try {
      const started = await nestingApi.startNestRun(workspaceId.value, built.request)
      run.value = started
      void follow(started.id)
    } catch (error) {
      active.value = false
      editor.busy.value = false
      handlers.onError(error, 'Could not start auto-arrange.')
    }
  }

  /** `keepBest`: use the best arrangement found so far; otherwise leave the layout as it was. */
  async function stop(keepBest: boolean): Promise<void> {
    const current = run.value
    if (!current || !active.value) return
    outcome = keepBest ? 'apply' : 'discard'
    stopping.value = true
    try {
      const answer = await nestingApi.cancelNestRun(workspaceId.value, current.id)
      if (isFinished(answer.status) && active.value) finish(answer)
    } catch (error) {
      stopping.value = false
      handlers.onError(error, 'Could not stop auto-arrange.')
    }
  }

  onScopeDispose(() => {
    // Leaving the editor mid-run: the search is of no use to anyone, so it is asked to stop.
    if (active.value && run.value) void nestingApi.cancelNestRun(workspaceId.value, run.value.id).catch(() => {})
    controller?.abort()
    editor.busy.value = false
  })

  return { run, progress, active, stopping, lockedCount, start, stop }
}
