import { request, segment } from '../../api/client'
import { dashboardSchema, type Dashboard } from '../../../shared/schemas/index'

export function getDashboard(workspaceId: string): Promise<Dashboard> {
  return request(`/api/workspaces/${segment(workspaceId)}/dashboard`, { schema: dashboardSchema })
}
