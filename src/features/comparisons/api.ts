import { z } from 'zod'
import { request, segment } from '../../api/client'
import {
  comparisonDetailSchema,
  comparisonSummarySchema,
  type ComparisonDetail,
  type ComparisonSummary,
  type CreateComparisonRequest,
} from '../../../shared/schemas/comparisons'

const comparisonsPath = (workspaceId: string) => `/api/workspaces/${segment(workspaceId)}/comparisons`
const comparisonPath = (workspaceId: string, comparisonId: string) => `${comparisonsPath(workspaceId)}/${segment(comparisonId)}`

/** Starts one nest run per stock; the answer (202) is the comparison with its rows still queued. */
export function startComparison(workspaceId: string, body: CreateComparisonRequest): Promise<ComparisonDetail> {
  return request(comparisonsPath(workspaceId), { method: 'POST', body, schema: comparisonDetailSchema })
}

export function listComparisons(workspaceId: string): Promise<ComparisonSummary[]> {
  return request(comparisonsPath(workspaceId), { schema: z.array(comparisonSummarySchema) })
}

export function getComparison(workspaceId: string, comparisonId: string): Promise<ComparisonDetail> {
  return request(comparisonPath(workspaceId, comparisonId), { schema: comparisonDetailSchema })
}

export function cancelComparison(workspaceId: string, comparisonId: string): Promise<ComparisonDetail> {
  return request(`${comparisonPath(workspaceId, comparisonId)}/cancel`, { method: 'POST', schema: comparisonDetailSchema })
}

export function rerunComparison(workspaceId: string, comparisonId: string): Promise<ComparisonDetail> {
  return request(`${comparisonPath(workspaceId, comparisonId)}/rerun`, { method: 'POST', schema: comparisonDetailSchema })
}
