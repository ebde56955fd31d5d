import type { JobStatus } from '../schemas/jobs.js'

/**
 * The moves a job may make. `cutting → planned` is allowed: a run stopped before anything was used (wrong material
 * loaded, cutter needed for something urgent) goes back to the plan. Done and scrapped are final: done has already
 * taken stock and added blade wear, so undoing it by a status change would leave those records wrong.
 */
export const allowedTransitions: Record<JobStatus, readonly JobStatus[]> = {
  planned: ['cutting', 'scrapped'],
  cutting: ['done', 'scrapped', 'planned'],
  done: [],
  scrapped: [],
}

export const isOpenStatus = (status: JobStatus): boolean => status === 'planned' || status === 'cutting'

export function canMove(from: JobStatus, to: JobStatus): boolean {
  return allowedTransitions[from].includes(to)
}

const words: Record<JobStatus, string> = { planned: 'planned', cutting: 'cutting', done: 'done', scrapped: 'scrapped' }

/** Why a move is refused, in a sentence for the person who tried it; null when it is allowed. */
export function transitionProblem(from: JobStatus, to: JobStatus): string | null {
  if (canMove(from, to)) return null
  if (from === to) return `This job is already ${words[to]}`
  if (from === 'done') return 'This job is done: its stock and blade wear are recorded, so it cannot change status again'
  if (from === 'scrapped') return 'This job is scrapped: make a new job to cut it again'
  if (from === 'planned' && to === 'done') return 'Start cutting before marking the job done'
  return `A ${words[from]} job cannot become ${words[to]}`
}
