import { Worker } from 'node:worker_threads'
import type { ImportedDesign, ImportOptions } from '../../../shared/geometry/importSvg.js'
import type { DesignPreview } from '../../../shared/schemas/designs.js'

const threadEntry = new URL('./importThread.ts', import.meta.url)

export type ImportOutcome =
  | { ok: true; design: ImportedDesign; preview: DesignPreview; sanitizedSvg: string }
  | { ok: false; code: string; message: string; detail?: string }

export interface ImportLimits {
  /** Longest one file may take before it is given up as too complex. */
  timeoutMs: number
  /** Heap ceiling of the reading thread; a file that needs more is too complex. */
  maxHeapMb: number
}

export const defaultImportLimits: ImportLimits = { timeoutMs: 20_000, maxHeapMb: 1024 }

function startThread(limits: ImportLimits): Worker {
  const bootstrap = `import('tsx/esm/api').then(({ register }) => { register(); return import(${JSON.stringify(threadEntry.href)}) })`
  return new Worker(bootstrap, { eval: true, resourceLimits: { maxOldGenerationSizeMb: limits.maxHeapMb } })
}

/**
 * Reads SVG texts in a worker thread, one after another, so a pathological file can neither block the API nor
 * exhaust its memory: a file over the time or memory limit is answered as too complex and the thread replaced.
 */
export async function importInWorker(texts: string[], options: ImportOptions, limits: ImportLimits = defaultImportLimits): Promise<ImportOutcome[]> {
  const outcomes: ImportOutcome[] = []
  let worker: Worker | undefined
  try {
    for (let index = 0; index < texts.length; index++) {
      worker ??= startThread(limits)
      const current = worker
      const outcome = await new Promise<ImportOutcome>((resolve) => {
        const tooComplex = (why: string): ImportOutcome => ({ ok: false, code: 'too_complex', message: `The file is too complex to read (${why}); simplify it or split it into several files` })
        const timer = setTimeout(() => {
          cleanup()
          void current.terminate()
          worker = undefined
          resolve(tooComplex(`it took longer than ${limits.timeoutMs / 1000} s`))
        }, limits.timeoutMs)
        const onMessage = (message: ImportOutcome & { index: number }) => {
          if (message.index !== index) return
          cleanup()
          resolve(message)
        }
        const onError = (error: Error & { code?: string }) => {
          cleanup()
          worker = undefined
          resolve(error.code === 'ERR_WORKER_OUT_OF_MEMORY' ? tooComplex('it needs too much memory') : { ok: false, code: 'unreadable', message: 'The file could not be read as a design', detail: error.message })
        }
        const onExit = () => {
          cleanup()
          worker = undefined
          resolve(tooComplex('the reader stopped'))
        }
        const cleanup = () => {
          clearTimeout(timer)
          current.off('message', onMessage)
          current.off('error', onError)
          current.off('exit', onExit)
        }
        current.on('message', onMessage)
        current.on('error', onError)
        current.on('exit', onExit)
        current.postMessage({ index, text: texts[index], options })
      })
      outcomes.push(outcome)
    }
  } finally {
    await worker?.terminate()
  }
  return outcomes
}
