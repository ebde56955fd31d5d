import { download, request, segment, type DownloadedFile } from '../../api/client'
import {
  layoutDetailSchema,
  layoutListResponseSchema,
  type CreateLayoutRequest,
  type LayoutDetail,
  type LayoutListResponse,
  type UpdateLayoutRequest,
} from '../../../shared/schemas/layouts'

const layoutsPath = (workspaceId: string) => `/api/workspaces/${segment(workspaceId)}/layouts`
const layoutPath = (workspaceId: string, layoutId: string) => `${layoutsPath(workspaceId)}/${segment(layoutId)}`

export interface LayoutListFilter {
  search?: string
  templates: 'only' | 'exclude' | 'include'
  page: number
  pageSize: number
}

export function listLayouts(workspaceId: string, filter: LayoutListFilter): Promise<LayoutListResponse> {
  return request(layoutsPath(workspaceId), {
    query: { search: filter.search || undefined, templates: filter.templates, page: filter.page, pageSize: filter.pageSize },
    schema: layoutListResponseSchema,
  })
}

export function getLayout(workspaceId: string, layoutId: string): Promise<LayoutDetail> {
  return request(layoutPath(workspaceId, layoutId), { schema: layoutDetailSchema })
}

export function createLayout(workspaceId: string, body: CreateLayoutRequest): Promise<LayoutDetail> {
  return request(layoutsPath(workspaceId), { method: 'POST', body, schema: layoutDetailSchema })
}

/** Saves over `body.version`; a stale version is refused with 409 `layout_version_conflict` and changes nothing. */
export function updateLayout(workspaceId: string, layoutId: string, body: UpdateLayoutRequest): Promise<LayoutDetail> {
  return request(layoutPath(workspaceId, layoutId), { method: 'PUT', body, schema: layoutDetailSchema })
}

export function deleteLayout(workspaceId: string, layoutId: string): Promise<void> {
  return request(layoutPath(workspaceId, layoutId), { method: 'DELETE' })
}

/** Duplicates a layout, starts a layout from a template, or keeps a layout as a template (`isTemplate`). */
export function copyLayout(workspaceId: string, layoutId: string, body: { name?: string; isTemplate: boolean }): Promise<LayoutDetail> {
  return request(`${layoutPath(workspaceId, layoutId)}/copy`, { method: 'POST', body, schema: layoutDetailSchema })
}

export type LayoutExportFormat = 'svg' | 'hpgl' | 'pdf'

/** A cut file of one sheet (SVG, HP-GL) or the printable job sheet (PDF; every sheet when `sheet` is left out), from the saved layout. */
export function downloadLayoutExport(workspaceId: string, layoutId: string, format: LayoutExportFormat, sheet?: number): Promise<DownloadedFile> {
  const query = new URLSearchParams({ format })
  if (sheet !== undefined) query.set('sheet', String(sheet))
  return download(`${layoutPath(workspaceId, layoutId)}/export?${query.toString()}`)
}
