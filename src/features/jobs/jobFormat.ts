import type { JobStatus, JobSummary, JobUsage } from '../../../shared/schemas/index'
import { formatLength, type LengthUnit } from '../../../shared/units'

export const statusLabel: Record<JobStatus, string> = { planned: 'Planned', cutting: 'Cutting', done: 'Done', scrapped: 'Scrapped' }
export const statusColor: Record<JobStatus, string> = { planned: 'blue-grey-6', cutting: 'orange-9', done: 'positive', scrapped: 'grey-7' }
export const statusIcon: Record<JobStatus, string> = { planned: 'event_note', cutting: 'content_cut', done: 'task_alt', scrapped: 'delete_sweep' }

/** Square inches per square millimetre: 1 in = 25.4 mm (exact). */
const MM2_PER_IN2 = 25.4 * 25.4

/** Areas for people: m² (or ft²) for stock-sized areas, cm² (or in²) for small ones. */
export function formatArea(areaMm2: number, unit: LengthUnit): string {
  if (unit === 'in') {
    const squareInches = areaMm2 / MM2_PER_IN2
    return squareInches >= 144 ? `${(squareInches / 144).toFixed(2)} ft²` : `${squareInches.toFixed(1)} in²`
  }
  return areaMm2 >= 100_000 ? `${(areaMm2 / 1_000_000).toFixed(3)} m²` : `${(areaMm2 / 100).toFixed(1)} cm²`
}

/** Long lengths (cut length, roll used) in m or ft; short ones through the usual length format. */
export function formatLongLength(lengthMm: number, unit: LengthUnit): string {
  if (unit === 'in') return lengthMm >= 304.8 * 3 ? `${(lengthMm / 304.8).toFixed(1)} ft` : formatLength(lengthMm, unit)
  return lengthMm >= 1000 ? `${(lengthMm / 1000).toFixed(2)} m` : formatLength(lengthMm, unit)
}

export function stockUseText(usage: JobUsage, kind: 'sheet' | 'roll' | undefined, unit: LengthUnit): string {
  if (kind === 'roll') return `${formatLongLength(usage.rollLengthUsedMm, unit)} of roll`
  return `${usage.sheetsUsed} ${usage.sheetsUsed === 1 ? 'sheet' : 'sheets'}`
}

export function dueText(job: Pick<JobSummary, 'dueDate' | 'dueState'>): string {
  if (!job.dueDate) return 'No due date'
  const day = new Date(`${job.dueDate}T00:00:00`)
  const text = day.toLocaleDateString(undefined, { weekday: 'short', day: 'numeric', month: 'short' })
  if (job.dueState === 'overdue') return `Overdue since ${text}`
  return `Due ${text}`
}

export const jobName = (job: Pick<JobSummary, 'number' | 'title'>) => `Job ${job.number} · ${job.title}`

export function formatInstant(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' })
}
