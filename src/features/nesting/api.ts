import { z } from 'zod'
import { openEventStream, request, segment } from '../../api/client'
import {
  nestProgressSchema,
  nestRunSchema,
  nestRunStatuses,
  type CreateNestRunRequest,
  type NestProgressDto,
  type NestRunDto,
  type NestRunStatus,
} from '../../../shared/schemas/index'
import { readEventStream } from './eventStream'

const runsPath = (workspaceId: string) => `/api/workspaces/${segment(workspaceId)}/nest-runs`
const runPath = (workspaceId: string, runId: string) => `${runsPath(workspaceId)}/${segment(runId)}`

/** Queues a run; the answer (202) is the run as stored, still `queued`. */
export function startNestRun(workspaceId: string, body: CreateNestRunRequest): Promise<NestRunDto> {
  return request(runsPath(workspaceId), { method: 'POST', body, schema: nestRunSchema })
}

/** The workspace's most recent runs, newest first (the server sends twenty). */
export function listNestRuns(workspaceId: string): Promise<NestRunDto[]> {
  return request(runsPath(workspaceId), { schema: z.array(nestRunSchema) })
}

export function getNestRun(workspaceId: string, runId: string): Promise<NestRunDto> {
  return request(runPath(workspaceId, runId), { schema: nestRunSchema })
}

/** A queued run is cancelled at once; a running one is asked to stop and keeps its best layout so far. */
export function cancelNestRun(workspaceId: string, runId: string): Promise<NestRunDto> {
  return request(`${runPath(workspaceId, runId)}/cancel`, { method: 'POST', schema: nestRunSchema })
}

const progressEventSchema = z.object({ status: z.enum(nestRunStatuses), progress: nestProgressSchema.nullable() })

export interface NestRunProgressUpdate {
  status: NestRunStatus
  progress: NestProgressDto | null
}

export interface NestRunStreamHandlers {
  onProgress: (update: NestRunProgressUpdate) => void
  onDone: (run: NestRunDto) => void
}

/**
 * Follows a run's server-sent events until its `done` event. Resolves true when `done` arrived, false when the
 * stream closed without it; rejects when the stream cannot be opened or breaks (callers then poll instead).
 */
export async function followNestRunEvents(workspaceId: string, runId: string, handlers: NestRunStreamHandlers, signal: AbortSignal): Promise<boolean> {
  const stream = await openEventStream(`${runPath(workspaceId, runId)}/events`, signal)
  let finished = false
  await readEventStream(stream, (event) => {
    if (finished) return
    const payload: unknown = JSON.parse(event.data)
    if (event.event === 'progress') {
      handlers.onProgress(progressEventSchema.parse(payload))
    } else if (event.event === 'done') {
      finished = true
      handlers.onDone(nestRunSchema.parse(payload))
    }
  })
  return finished
}
