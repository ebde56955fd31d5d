import { request, segment } from '../../api/client'
import {
  bladeListResponseSchema,
  bladeSchema,
  careEventListResponseSchema,
  careEventSchema,
  cutterListResponseSchema,
  cutterSchema,
  deleteCutterResponseSchema,
  studioSettingsSchema,
  testCutPromptSchema,
  type Blade,
  type BladeListResponse,
  type CareEvent,
  type CareEventKind,
  type CareEventListResponse,
  type CreateCareEventRequest,
  type CreateCutterRequest,
  type Cutter,
  type CutterListResponse,
  type CutterToolKind,
  type DeleteCutterResponse,
  type FitBladeRequest,
  type StudioSettings,
  type TestCutPromptDto,
  type UpdateCutterRequest,
  type UpdateStudioSettingsRequest,
} from '../../../shared/schemas/index'

const cuttersPath = (workspaceId: string) => `/api/workspaces/${segment(workspaceId)}/cutters`
const cutterPath = (workspaceId: string, cutterId: string) => `${cuttersPath(workspaceId)}/${segment(cutterId)}`

export interface CutterListFilter {
  status: 'active' | 'archived' | 'all'
  toolKind?: CutterToolKind
  page: number
  pageSize: number
}

export function listCutters(workspaceId: string, filter: CutterListFilter): Promise<CutterListResponse> {
  return request(cuttersPath(workspaceId), { query: { status: filter.status, toolKind: filter.toolKind, page: filter.page, pageSize: filter.pageSize }, schema: cutterListResponseSchema })
}

export function getCutter(workspaceId: string, cutterId: string): Promise<Cutter> {
  return request(cutterPath(workspaceId, cutterId), { schema: cutterSchema })
}

export function createCutter(workspaceId: string, body: CreateCutterRequest): Promise<Cutter> {
  return request(cuttersPath(workspaceId), { method: 'POST', body, schema: cutterSchema })
}

export function updateCutter(workspaceId: string, cutterId: string, changes: UpdateCutterRequest): Promise<Cutter> {
  return request(cutterPath(workspaceId, cutterId), { method: 'PATCH', body: changes, schema: cutterSchema })
}

export function deleteCutter(workspaceId: string, cutterId: string): Promise<DeleteCutterResponse> {
  return request(cutterPath(workspaceId, cutterId), { method: 'DELETE', schema: deleteCutterResponseSchema })
}

export function listBlades(workspaceId: string, cutterId: string, page = 1, pageSize = 20): Promise<BladeListResponse> {
  return request(`${cutterPath(workspaceId, cutterId)}/blades`, { query: { page, pageSize }, schema: bladeListResponseSchema })
}

export function fitBlade(workspaceId: string, cutterId: string, body: FitBladeRequest): Promise<Blade> {
  return request(`${cutterPath(workspaceId, cutterId)}/blades`, { method: 'POST', body, schema: bladeSchema })
}

export function retireBlade(workspaceId: string, cutterId: string, bladeId: string, reason: string): Promise<Blade> {
  return request(`${cutterPath(workspaceId, cutterId)}/blades/${segment(bladeId)}/retire`, { method: 'POST', body: { reason }, schema: bladeSchema })
}

export function listCareEvents(workspaceId: string, cutterId: string, query: { kind?: CareEventKind; page: number; pageSize: number }): Promise<CareEventListResponse> {
  return request(`${cutterPath(workspaceId, cutterId)}/care-events`, { query: { kind: query.kind, page: query.page, pageSize: query.pageSize }, schema: careEventListResponseSchema })
}

export function logCareEvent(workspaceId: string, cutterId: string, body: CreateCareEventRequest): Promise<CareEvent> {
  return request(`${cutterPath(workspaceId, cutterId)}/care-events`, { method: 'POST', body, schema: careEventSchema })
}

export function deleteCareEvent(workspaceId: string, cutterId: string, careEventId: string): Promise<void> {
  return request(`${cutterPath(workspaceId, cutterId)}/care-events/${segment(careEventId)}`, { method: 'DELETE' })
}

export function testCutPrompt(workspaceId: string, cutterId: string, materialId: string): Promise<TestCutPromptDto> {
  return request(`${cutterPath(workspaceId, cutterId)}/test-cut-prompt`, { query: { materialId }, schema: testCutPromptSchema })
}

export function getStudioSettings(workspaceId: string): Promise<StudioSettings> {
  return request(`/api/workspaces/${segment(workspaceId)}/studio-settings`, { schema: studioSettingsSchema })
}

export function updateStudioSettings(workspaceId: string, body: UpdateStudioSettingsRequest): Promise<StudioSettings> {
  return request(`/api/workspaces/${segment(workspaceId)}/studio-settings`, { method: 'PUT', body, schema: studioSettingsSchema })
}
