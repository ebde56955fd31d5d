import { describe, expect, it } from 'vitest'
import { allowedTransitions, canMove, transitionProblem } from '../../../shared/jobs/status.js'
import { jobStatuses } from '../../../shared/schemas/jobs.js'

// The allowed moves are the product's rule from the job issue: planned → cutting → done, or scrapped; done and
// scrapped are final. cutting → planned is our own decision (a run stopped before anything was used).

describe('job status transitions', () => {
  it('allows the forward path and scrapping of open jobs', () => {
    expect(canMove('planned', 'cutting')).toBe(true)
    expect(canMove('cutting', 'done')).toBe(true)
    expect(canMove('planned', 'scrapped')).toBe(true)
    expect(canMove('cutting', 'scrapped')).toBe(true)
    expect(canMove('cutting', 'planned')).toBe(true)
  })

  it('refuses every move out of done and scrapped, with a reason', () => {
    for (const to of jobStatuses) {
      expect(canMove('done', to)).toBe(false)
      expect(canMove('scrapped', to)).toBe(false)
    }
    expect(transitionProblem('done', 'planned')).toMatch(/done.*cannot change status/)
    expect(transitionProblem('scrapped', 'cutting')).toMatch(/scrapped/)
  })

  it('refuses skipping cutting and standing still', () => {
    expect(transitionProblem('planned', 'done')).toBe('Start cutting before marking the job done')
    expect(transitionProblem('planned', 'planned')).toBe('This job is already planned')
    expect(transitionProblem('planned', 'cutting')).toBeNull()
  })

  it('lists exactly five allowed moves', () => {
    expect(Object.values(allowedTransitions).flat()).toHaveLength(5)
  })
})
