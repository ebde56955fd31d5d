/**
 * Undo and redo over immutable snapshots. Every editor action makes a new document that shares what it did not
 * change with the one before (placements untouched by a move are the same objects), so keeping a snapshot per step
 * costs one array of references, and undo can never drift from what was shown.
 */
export interface HistoryStep<T> {
  label: string
  before: T
  after: T
  /** Steps with the same key in a row become one (arrow-key nudges of one selection are one undo). */
  mergeKey?: string
}

export interface HistoryOptions {
  /** Steps kept; the oldest fall off. */
  limit?: number
}

export function createHistory<T>(initial: T, options: HistoryOptions = {}) {
  const limit = options.limit ?? 200
  let present = initial
  let done: HistoryStep<T>[] = []
  let undone: HistoryStep<T>[] = []

  /** Records a step from the present to `next` and makes `next` the present. A step to the same snapshot is dropped. */
  function apply(label: string, next: T, mergeKey?: string): T {
    if (next === present) return present
    const last = done[done.length - 1]
    if (mergeKey !== undefined && last && last.mergeKey === mergeKey && undone.length === 0) {
      last.after = next
    } else {
      done.push({ label, before: present, after: next, mergeKey })
      if (done.length > limit) done = done.slice(done.length - limit)
    }
    undone = []
    present = next
    return present
  }

  /** Goes one step back; null when there is nothing to undo. */
  function undo(): T | null {
    const step = done.pop()
    if (!step) return null
    undone.push({ ...step, mergeKey: undefined })
    present = step.before
    return present
  }

  function redo(): T | null {
    const step = undone.pop()
    if (!step) return null
    done.push(step)
    present = step.after
    return present
  }

  /** Starts over from a snapshot (a layout loaded or reloaded), forgetting every step. */
  function reset(snapshot: T): void {
    present = snapshot
    done = []
    undone = []
  }

  /** Ends a run of merged steps, so the next step with the same key stands on its own. */
  function seal(): void {
    const last = done[done.length - 1]
    if (last) last.mergeKey = undefined
  }

  return {
    apply,
    undo,
    redo,
    reset,
    seal,
    get present() {
      return present
    },
    get canUndo() {
      return done.length > 0
    },
    get canRedo() {
      return undone.length > 0
    },
    get undoLabel(): string | null {
      return done[done.length - 1]?.label ?? null
    },
    get redoLabel(): string | null {
      return undone[undone.length - 1]?.label ?? null
    },
  }
}
export type History<T> = ReturnType<typeof createHistory<T>>
