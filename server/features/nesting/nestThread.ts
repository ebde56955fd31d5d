// Worker-thread entry: runs one seeded search of the nesting engine so the event loop of the API stays free.
import { parentPort, workerData } from 'node:worker_threads'
import { nest } from '../../../shared/nesting/nest.js'
import type { NestOptions, NestProblem } from '../../../shared/nesting/types.js'

interface ThreadInput {
  problem: NestProblem
  options: Pick<NestOptions, 'seed' | 'timeBudgetMs' | 'maxEvaluations'>
  /** One Int32 cell: set to 1 by the parent to stop the search early. */
  stopFlag: SharedArrayBuffer
}

const input = workerData as ThreadInput
const stop = new Int32Array(input.stopFlag)
try {
  const result = nest(input.problem, {
    ...input.options,
    shouldStop: () => Atomics.load(stop, 0) === 1,
    onProgress: (progress) => parentPort!.postMessage({ type: 'progress', progress }),
  })
  parentPort!.postMessage({ type: 'result', result })
} catch (error) {
  parentPort!.postMessage({ type: 'error', message: error instanceof Error ? error.message : String(error), inputError: error instanceof Error && error.name === 'NestInputError' })
}
