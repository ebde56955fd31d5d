import { computed, ref } from 'vue'
import { isApiError } from '../../../api/ApiError'
import { isAbortError } from '../../../api/client'
import type { DesignSummary } from '../../../../shared/schemas/index'
import { uploadDesigns, type DesignReadingOptions } from '../api'

/** The server's limits (server/features/designs/designs.routes.ts): checked here so nobody waits for a sure refusal. */
export const MAX_FILES_PER_UPLOAD = 20
export const MAX_FILE_BYTES = 10 * 1024 * 1024

export interface DesignUploadRejection {
  filename: string
  code: string
  message: string
}

export interface DesignUploadSummary {
  added: DesignSummary[]
  rejected: DesignUploadRejection[]
  cancelled: boolean
}

export type DesignUploadPhase = 'idle' | 'sending' | 'reading'

/** Files the server would refuse anyway: not SVG by name or type, or too large. */
export function precheckFile(file: File): DesignUploadRejection | null {
  if (!/\.svg$/i.test(file.name) && file.type !== 'image/svg+xml') {
    return { filename: file.name, code: 'not_svg', message: 'Only SVG files (.svg) can be uploaded' }
  }
  if (file.size > MAX_FILE_BYTES) return { filename: file.name, code: 'too_large', message: 'Larger than 10 MB' }
  return null
}

/** Groups of at most MAX_FILES_PER_UPLOAD files, one request each. */
export function batchesOf<T>(items: readonly T[], size = MAX_FILES_PER_UPLOAD): T[][] {
  const batches: T[][] = []
  for (let start = 0; start < items.length; start += size) batches.push(items.slice(start, start + size))
  return batches
}

/** A 400 "nothing usable" answer names each file under `body.files.<filename>`. */
function rejectionsFromError(error: unknown, batch: readonly File[]): DesignUploadRejection[] | null {
  if (!isApiError(error)) return null
  if (error.status === 413) return batch.map((file) => ({ filename: file.name, code: 'too_large', message: error.message }))
  if (error.status !== 400) return null
  const prefix = 'body.files.'
  const named = Object.entries(error.fields)
    .filter(([field]) => field.startsWith(prefix))
    .map(([field, messages]) => ({ filename: field.slice(prefix.length), code: error.code, message: messages[0] ?? error.message }))
  if (named.length > 0) return named
  if ('body.files' in error.fields) return batch.map((file) => ({ filename: file.name, code: error.code, message: error.message }))
  return null
}

/**
 * Sends SVG files to a workspace's library with progress, in batches the server accepts, and collects
 * one summary: what was added, and every file that was not, with its reason.
 */
export function useDesignUpload() {
  const phase = ref<DesignUploadPhase>('idle')
  /** 0–1 over all bytes of this upload. */
  const progress = ref(0)
  const fileCount = ref(0)
  const summary = ref<DesignUploadSummary | null>(null)
  const busy = computed(() => phase.value !== 'idle')
  let controller: AbortController | null = null

  /** Resolves with the summary; rejects (after setting the summary) when the server could not be reached. */
  async function uploadFiles(workspaceId: string, files: readonly File[], options: DesignReadingOptions): Promise<DesignUploadSummary> {
    if (busy.value) throw new Error('An upload is already running')
    const result: DesignUploadSummary = { added: [], rejected: [], cancelled: false }
    const sendable: File[] = []
    for (const file of files) {
      const refusal = precheckFile(file)
      if (refusal) result.rejected.push(refusal)
      else sendable.push(file)
    }

    controller = new AbortController()
    const signal = controller.signal
    const totalBytes = Math.max(1, sendable.reduce((sum, file) => sum + file.size, 0))
    let doneBytes = 0
    let failure: unknown = null
    fileCount.value = sendable.length
    progress.value = 0
    summary.value = null
    phase.value = sendable.length > 0 ? 'sending' : 'idle'

    const batches = batchesOf(sendable)
    for (const [index, batch] of batches.entries()) {
      const batchBytes = batch.reduce((sum, file) => sum + file.size, 0)
      phase.value = 'sending'
      try {
        const answer = await uploadDesigns(workspaceId, batch, options, {
          signal,
          onProgress: (sentBytes, requestBytes) => {
            // The request also carries multipart headers, so scale its share to the files' bytes.
            progress.value = Math.min(1, (doneBytes + (batchBytes * sentBytes) / Math.max(1, requestBytes)) / totalBytes)
            if (sentBytes >= requestBytes) phase.value = 'reading'
          },
        })
        result.added.push(...answer.designs)
        result.rejected.push(...answer.rejected)
      } catch (error) {
        const rejections = rejectionsFromError(error, batch)
        if (rejections) result.rejected.push(...rejections)
        else {
          const notSent = batches.slice(index).flat()
          if (isAbortError(error)) result.cancelled = true
          else failure = error
          const reason = isAbortError(error) ? 'Not uploaded: the upload was cancelled' : 'Not uploaded: the upload stopped before this file was read'
          result.rejected.push(...notSent.map((file) => ({ filename: file.name, code: 'not_sent', message: reason })))
          break
        }
      }
      doneBytes += batchBytes
      progress.value = doneBytes / totalBytes
    }

    controller = null
    phase.value = 'idle'
    summary.value = result
    if (failure) throw failure
    return result
  }

  function cancel(): void {
    controller?.abort()
  }

  function dismissSummary(): void {
    summary.value = null
  }

  return { phase, progress, fileCount, summary, busy, uploadFiles, cancel, dismissSummary }
}
