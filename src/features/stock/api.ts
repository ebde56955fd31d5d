import { request, segment } from '../../api/client'
import {
  stockItemSchema,
  stockListResponseSchema,
  type CreateStockRequest,
  type StockItem,
  type StockKind,
  type StockListResponse,
  type UpdateStockRequest,
} from '../../../shared/schemas/index'

const stockPath = (workspaceId: string) => `/api/workspaces/${segment(workspaceId)}/stock`
const itemPath = (workspaceId: string, stockId: string) => `${stockPath(workspaceId)}/${segment(stockId)}`

export interface StockListFilter {
  search?: string
  kind?: StockKind
  status: 'active' | 'archived' | 'all'
  page: number
  pageSize: number
}

export function listStock(workspaceId: string, query: StockListFilter): Promise<StockListResponse> {
  return request(stockPath(workspaceId), {
    query: { search: query.search || undefined, kind: query.kind, status: query.status, page: query.page, pageSize: query.pageSize },
    schema: stockListResponseSchema,
  })
}

/** Remnants kept from jobs (active ones, newest first as the server lists them), for the stock pickers of layouts and nest runs. */
export function listRemnants(workspaceId: string, pageSize = 100): Promise<StockListResponse> {
  return request(`/api/workspaces/${segment(workspaceId)}/remnants`, { query: { status: 'active', page: 1, pageSize }, schema: stockListResponseSchema })
}

export function createStock(workspaceId: string, body: CreateStockRequest): Promise<StockItem> {
  return request(stockPath(workspaceId), { method: 'POST', body, schema: stockItemSchema })
}

export function updateStock(workspaceId: string, stockId: string, changes: UpdateStockRequest): Promise<StockItem> {
  return request(itemPath(workspaceId, stockId), { method: 'PATCH', body: changes, schema: stockItemSchema })
}

export function deleteStock(workspaceId: string, stockId: string): Promise<void> {
  return request(itemPath(workspaceId, stockId), { method: 'DELETE' })
}
