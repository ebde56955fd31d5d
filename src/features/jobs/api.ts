import { request, segment } from '../../api/client'
import {
  jobListResponseSchema,
  jobSchema,
  stockListResponseSchema,
  type CreateJobRequest,
  type Job,
  type JobListResponse,
  type JobStatus,
  type JobStatusRequest,
  type StockListResponse,
  type UpdateJobRequest,
} from '../../../shared/schemas/index'

const jobsPath = (workspaceId: string) => `/api/workspaces/${segment(workspaceId)}/jobs`
const jobPath = (workspaceId: string, jobId: string) => `${jobsPath(workspaceId)}/${segment(jobId)}`

export interface JobListFilter {
  search?: string
  status?: JobStatus | 'open'
  materialId?: string
  dueBefore?: string
  dueAfter?: string
  dueSoon?: boolean
  page: number
  pageSize: number
}

export function listJobs(workspaceId: string, filter: JobListFilter): Promise<JobListResponse> {
  return request(jobsPath(workspaceId), {
    query: {
      search: filter.search || undefined,
      status: filter.status,
      materialId: filter.materialId,
      dueBefore: filter.dueBefore || undefined,
      dueAfter: filter.dueAfter || undefined,
      dueSoon: filter.dueSoon ? 'true' : undefined,
      page: filter.page,
      pageSize: filter.pageSize,
    },
    schema: jobListResponseSchema,
  })
}

export function getJob(workspaceId: string, jobId: string): Promise<Job> {
  return request(jobPath(workspaceId, jobId), { schema: jobSchema })
}

export function createJob(workspaceId: string, body: CreateJobRequest): Promise<Job> {
  return request(jobsPath(workspaceId), { method: 'POST', body, schema: jobSchema })
}

export function updateJob(workspaceId: string, jobId: string, body: UpdateJobRequest): Promise<Job> {
  return request(jobPath(workspaceId, jobId), { method: 'PATCH', body, schema: jobSchema })
}

export function changeJobStatus(workspaceId: string, jobId: string, body: JobStatusRequest): Promise<Job> {
  return request(`${jobPath(workspaceId, jobId)}/status`, { method: 'POST', body, schema: jobSchema })
}

export function deleteJob(workspaceId: string, jobId: string): Promise<void> {
  return request(jobPath(workspaceId, jobId), { method: 'DELETE' })
}

export function listRemnants(workspaceId: string, page = 1): Promise<StockListResponse> {
  return request(`/api/workspaces/${segment(workspaceId)}/remnants`, { query: { page, pageSize: 50 }, schema: stockListResponseSchema })
}
