import { z } from 'zod'
import { request, segment } from '../../api/client'
import { workspaceSummarySchema, type WorkspaceSummary } from '../../../shared/schemas/index'

export function listWorkspaces(): Promise<WorkspaceSummary[]> {
  return request('/api/workspaces', { schema: z.array(workspaceSummarySchema) })
}

export function createWorkspace(name: string): Promise<WorkspaceSummary> {
  return request('/api/workspaces', { method: 'POST', body: { name }, schema: workspaceSummarySchema })
}

