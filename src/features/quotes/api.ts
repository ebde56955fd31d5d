import { download, request, segment, type DownloadedFile } from '../../api/client'
import {
  publicPayResponseSchema,
  publicQuoteSchema,
  quoteDetailSchema,
  quoteListResponseSchema,
  quoteSourcesSchema,
  type CreateQuoteRequest,
  type PublicQuote,
  type QuoteDetail,
  type QuoteListResponse,
  type QuoteSources,
  type QuoteStatus,
  type SendQuoteRequest,
  type UpdateQuoteRequest,
} from '../../../shared/schemas/quotes'

const quotesPath = (workspaceId: string) => `/api/workspaces/${segment(workspaceId)}/quotes`
const quotePath = (workspaceId: string, quoteId: string) => `${quotesPath(workspaceId)}/${segment(quoteId)}`
const publicPath = (token: string) => `/api/public/quotes/${segment(token)}`

export function listQuotes(workspaceId: string, query: { status?: QuoteStatus; search?: string; page: number; pageSize: number }): Promise<QuoteListResponse> {
  return request(quotesPath(workspaceId), { query: { ...query, search: query.search || undefined }, schema: quoteListResponseSchema })
}

export function quoteSources(workspaceId: string): Promise<QuoteSources> {
  return request(`${quotesPath(workspaceId)}/sources`, { schema: quoteSourcesSchema })
}

export function createQuote(workspaceId: string, body: CreateQuoteRequest): Promise<QuoteDetail> {
  return request(quotesPath(workspaceId), { method: 'POST', body, schema: quoteDetailSchema })
}

export function getQuote(workspaceId: string, quoteId: string): Promise<QuoteDetail> {
  return request(quotePath(workspaceId, quoteId), { schema: quoteDetailSchema })
}

export function updateQuote(workspaceId: string, quoteId: string, body: UpdateQuoteRequest): Promise<QuoteDetail> {
  return request(quotePath(workspaceId, quoteId), { method: 'PATCH', body, schema: quoteDetailSchema })
}

export function sendQuote(workspaceId: string, quoteId: string, body: SendQuoteRequest): Promise<QuoteDetail> {
  return request(`${quotePath(workspaceId, quoteId)}/send`, { method: 'POST', body, schema: quoteDetailSchema })
}

export function setQuoteStatus(workspaceId: string, quoteId: string, status: 'accepted' | 'declined' | 'expired' | 'paid', note = ''): Promise<QuoteDetail> {
  return request(`${quotePath(workspaceId, quoteId)}/status`, { method: 'POST', body: { status, note }, schema: quoteDetailSchema })
}

export function downloadQuotePdf(workspaceId: string, quoteId: string): Promise<DownloadedFile> {
  return download(`${quotePath(workspaceId, quoteId)}/pdf`)
}

// The customer's page carries no session: the link's token is the only key.
export function getPublicQuote(token: string): Promise<PublicQuote> {
  return request(publicPath(token), { schema: publicQuoteSchema, withoutSession: true })
}

export function respondToQuote(token: string, answer: 'accept' | 'decline'): Promise<PublicQuote> {
  return request(`${publicPath(token)}/${answer}`, { method: 'POST', schema: publicQuoteSchema, withoutSession: true })
}

export function payLink(token: string): Promise<{ url: string }> {
  return request(`${publicPath(token)}/pay`, { method: 'POST', schema: publicPayResponseSchema, withoutSession: true })
}

export const publicPdfUrl = (token: string) => `${publicPath(token)}/pdf`
