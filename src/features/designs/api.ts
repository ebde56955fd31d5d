import { download, request, segment, upload, type DownloadedFile } from '../../api/client'
import {
  designDetailSchema,
  designListResponseSchema,
  uploadDesignsResponseSchema,
  type DesignDetail,
  type DesignListResponse,
  type UpdateDesignRequest,
  type UploadDesignsResponse,
} from '../../../shared/schemas/index'

const designsPath = (workspaceId: string) => `/api/workspaces/${segment(workspaceId)}/designs`
const designPath = (workspaceId: string, designId: string) => `${designsPath(workspaceId)}/${segment(designId)}`

export interface DesignListFilter {
  search?: string
  tag?: string
  page: number
  pageSize: number
}

export function listDesigns(workspaceId: string, filter: DesignListFilter): Promise<DesignListResponse> {
  return request(designsPath(workspaceId), {
    query: { search: filter.search || undefined, tag: filter.tag || undefined, page: filter.page, pageSize: filter.pageSize },
    schema: designListResponseSchema,
  })
}

export function getDesign(workspaceId: string, designId: string): Promise<DesignDetail> {
  return request(designPath(workspaceId, designId), { schema: designDetailSchema })
}

/** How the server reads the files; millimetres, as the API takes them. Left out = the server's defaults. */
export interface DesignReadingOptions {
  toleranceMm?: number
  minSpeckAreaMm2?: number
}

export interface UploadProgressHandlers {
  onProgress?: (sentBytes: number, totalBytes: number) => void
  signal?: AbortSignal
}

/** Sends SVG files in the `files` field; the answer lists what was added and what was rejected, and why. */
export function uploadDesigns(
  workspaceId: string,
  files: readonly File[],
  options: DesignReadingOptions,
  handlers: UploadProgressHandlers = {},
): Promise<UploadDesignsResponse> {
  const form = new FormData()
  // Text fields first: the server reads them while the files stream in.
  if (options.toleranceMm !== undefined) form.append('toleranceMm', String(options.toleranceMm))
  if (options.minSpeckAreaMm2 !== undefined) form.append('minSpeckAreaMm2', String(options.minSpeckAreaMm2))
  for (const file of files) form.append('files', file, file.name)
  return upload(designsPath(workspaceId), form, { schema: uploadDesignsResponseSchema, ...handlers })
}

export function updateDesign(workspaceId: string, designId: string, changes: UpdateDesignRequest): Promise<DesignDetail> {
  return request(designPath(workspaceId, designId), { method: 'PATCH', body: changes, schema: designDetailSchema })
}

export function deleteDesign(workspaceId: string, designId: string): Promise<void> {
  return request(designPath(workspaceId, designId), { method: 'DELETE' })
}

/** The sanitised SVG as uploaded (scripts and external references removed by the server). */
export function downloadOriginal(workspaceId: string, designId: string): Promise<DownloadedFile> {
  return download(`${designPath(workspaceId, designId)}/original`)
}
