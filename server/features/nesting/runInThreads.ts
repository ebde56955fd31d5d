import { Worker } from 'node:worker_threads'
import { availableParallelism } from 'node:os'
import { verifyLayout, type VerifyReport } from '../../../shared/nesting/verify.js'
import type { NestProblem, NestProgress, NestResult } from '../../../shared/nesting/types.js'

const threadEntry = new URL('./nestThread.ts', import.meta.url)

export interface ThreadedNestOptions {
  seed?: number
  timeBudgetMs?: number
  maxEvaluations?: number
  /** Independent searches run side by side with seeds seed, seed+1, …; defaults to the machine's cores (at most 4). */
  threads?: number
  onProgress?: (progress: NestProgress) => void
  signal?: AbortSignal
}

export class NestRunError extends Error {
  constructor(
    message: string,
    readonly kind: 'input' | 'engine' | 'verification',
  ) {
    super(message)
  }
}

function runThread(problem: NestProblem, options: ThreadedNestOptions, seed: number, stopFlag: SharedArrayBuffer, onProgress: (progress: NestProgress) => void): Promise<NestResult> {
  return new Promise((resolve, reject) => {
    // The thread registers tsx itself before loading the TypeScript entry, whichever way this process was started
    // (tsx CLI, vitest, or plain node).
    const bootstrap = `import('tsx/esm/api').then(({ register }) => { register(); return import(${JSON.stringify(threadEntry.href)}) })`
    const worker = new Worker(bootstrap, {
      eval: true,
      workerData: { problem, options: { seed, timeBudgetMs: options.timeBudgetMs, maxEvaluations: options.maxEvaluations }, stopFlag },
    })
    let settled = false
    worker.on('message', (message: { type: string; progress?: NestProgress; result?: NestResult; message?: string; inputError?: boolean }) => {
      if (message.type === 'progress') onProgress(message.progress!)
      else if (message.type === 'result') {
        settled = true
        resolve(message.result!)
      } else if (message.type === 'error') {
        settled = true
        reject(new NestRunError(message.message!, message.inputError ? 'input' : 'engine'))
      }
    })
    worker.on('error', (error) => {
      if (!settled) reject(new NestRunError(error.message, 'engine'))
      settled = true
    })
    worker.on('exit', (code) => {
      if (!settled) reject(new NestRunError(`the nesting thread stopped unexpectedly (exit ${code})`, 'engine'))
    })
  })
}

const better = (left: NestResult, right: NestResult) => {
  if (left.unplaced.length !== right.unplaced.length) return left.unplaced.length < right.unplaced.length
  if (left.sheetCount !== right.sheetCount) return left.sheetCount < right.sheetCount
  return left.length <= right.length
}

/**
 * Runs independent seeded searches in worker threads (both cores on this machine), keeps the best layout and
 * verifies it independently. A layout that fails verification is an error, never a result.
 */
export async function runNestInThreads(problem: NestProblem, options: ThreadedNestOptions = {}): Promise<{ result: NestResult; verification: VerifyReport }> {
  const threads = Math.max(1, Math.min(options.threads ?? availableParallelism(), 4))
  const firstSeed = options.seed ?? 1
  const stopFlag = new SharedArrayBuffer(4)
  const stop = new Int32Array(stopFlag)
  const stopAll = () => Atomics.store(stop, 0, 1)
  if (options.signal?.aborted) stopAll()
  options.signal?.addEventListener('abort', stopAll, { once: true })
  const latest: (NestProgress | undefined)[] = []
  const report = (index: number) => (progress: NestProgress) => {
    latest[index] = progress
    const known = latest.filter((entry): entry is NestProgress => entry !== undefined)
    const best = known.reduce((top, entry) => (entry.bestUtilisation > top.bestUtilisation ? entry : top))
    options.onProgress?.({ ...best, evaluations: known.reduce((sum, entry) => sum + entry.evaluations, 0) })
  }
  try {
    const results = await Promise.all(Array.from({ length: threads }, (_, index) => runThread(problem, options, firstSeed + index, stopFlag, report(index))))
    const best = results.reduce((top, result) => (better(result, top) ? result : top))
    const verification = verifyLayout(problem, best)
    if (!verification.ok) throw new NestRunError(`The layout failed the independent check: ${verification.problems.slice(0, 3).join('; ')}`, 'verification')
    return { result: { ...best, evaluations: results.reduce((sum, result) => sum + result.evaluations, 0) }, verification }
  } finally {
    options.signal?.removeEventListener('abort', stopAll)
  }
}
