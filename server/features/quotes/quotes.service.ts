import { createHash, randomBytes } from 'node:crypto'
import { planLayout } from '../../../shared/cutplan/plan.js'
import { defaultCutPlanOptions, defaultCutterProfile } from '../../../shared/cutplan/profile.js'
import { customerLines, draftQuoteLines, priceQuote, type JobFactsForQuote, type QuoteLineInput } from '../../../shared/quotes/arithmetic.js'
import { formatMinor, toMinor } from '../../../shared/quotes/money.js'
import type {
  createQuoteRequestSchema,
  PublicQuote,
  QuoteDetail,
  QuoteListResponse,
  QuoteSources,
  QuoteStatus,
  QuoteSummary,
  quoteStatusChangeRequestSchema,
  sendQuoteRequestSchema,
  updateQuoteRequestSchema,
} from '../../../shared/schemas/quotes.js'
import type { z } from 'zod'
import type { AppContext } from '../../context.js'
import { profileOfCutter } from '../cutters/cutterProfile.js'
import { passesFor } from '../jobs/jobs.service.js'
import type { DatabaseOrTransaction } from '../../db/client.js'
import type { QuoteSourceFacts } from '../../db/schema/quotes.js'
import { AppError, conflict, invalidField, notFound } from '../../errors.js'
import { getComparison } from '../comparisons/comparisons.service.js'
import { findDesignsForCutPlan } from '../cutplan/cutplan.repo.js'
import type { CompletedCheckout } from '../payments/payments.client.js'
import { pricingOf } from '../pricing/pricing.service.js'
import { quoteMail } from './quotes.mail.js'
import { quotePdf } from './quotePdf.js'
import * as repo from './quotes.repo.js'

type Actor = 'member' | 'customer' | 'payment' | 'system'

const tokenHash = (token: string) => createHash('sha256').update(token).digest('hex')

/** A sent quote past its expiry reads as expired, whether or not a write has stored that yet. */
export function effectiveStatus(quote: Pick<repo.QuoteRow, 'status' | 'expiresAt'>, now = new Date()): QuoteStatus {
  if (quote.status === 'sent' && quote.expiresAt && quote.expiresAt.getTime() < now.getTime()) return 'expired'
  return quote.status
}

async function changeStatus(db: DatabaseOrTransaction, quote: repo.QuoteRow, to: QuoteStatus, actor: Actor, userId: string | null, note: string, extra: Partial<repo.NewQuoteRow> = {}) {
  await repo.updateQuote(db, quote.id, { status: to, ...extra })
  await repo.insertEvent(db, { workspaceId: quote.workspaceId, quoteId: quote.id, fromStatus: quote.status, toStatus: to, actor, byUserId: userId, note })
}

/** Stores the expiry of a sent quote past its date, in the caller's transaction, before any other change. */
async function expireIfDue(db: DatabaseOrTransaction, quote: repo.QuoteRow): Promise<repo.QuoteRow> {
  if (effectiveStatus(quote) !== 'expired' || quote.status === 'expired') return quote
  await changeStatus(db, quote, 'expired', 'system', null, 'Past its valid-until date')
  return { ...quote, status: 'expired' }
}

function sourceOf(quote: repo.QuoteRow): QuoteSummary['source'] {
  return { kind: quote.source.kind, label: quote.source.label, jobId: quote.jobId, comparisonId: quote.comparisonId }
}

function summaryOf(quote: repo.QuoteRow, totalMinor: number): QuoteSummary {
  return {
    id: quote.id,
    number: quote.number,
    title: quote.title,
    customerName: quote.customerName,
    customerEmail: quote.customerEmail,
    currency: quote.currency,
    status: effectiveStatus(quote),
    currentVersion: quote.currentVersion,
    totalMinor,
    source: sourceOf(quote),
    sentAt: quote.sentAt?.toISOString() ?? null,
    expiresAt: quote.expiresAt?.toISOString() ?? null,
    paidAt: quote.paidAt?.toISOString() ?? null,
    createdAt: quote.createdAt.toISOString(),
    updatedAt: quote.updatedAt.toISOString(),
  }
}

function totalsOf(version: repo.QuoteVersionRow, currency: string) {
  const priced = priceQuote(version.lines, { currency, minimumOrderMinor: version.minimumOrderMinor, taxRatePercent: version.taxRatePercent })
  return {
    subtotalMinor: version.subtotalMinor,
    minimumTopUpMinor: version.minimumTopUpMinor,
    taxMinor: version.taxMinor,
    totalMinor: version.totalMinor,
    taxRatePercent: version.taxRatePercent,
    minimumOrderMinor: version.minimumOrderMinor,
    arithmetic: priced.arithmetic,
  }
}

const payableStatuses: QuoteStatus[] = ['sent', 'accepted']

async function detailOf(context: AppContext, quote: repo.QuoteRow): Promise<QuoteDetail> {
  const [versions, events] = await Promise.all([repo.findVersions(context.db, quote.id), repo.findEvents(context.db, quote.id)])
  const current = versions.find((entry) => entry.version.version === quote.currentVersion)!.version
  const status = effectiveStatus(quote)
  return {
    ...summaryOf(quote, current.totalMinor),
    versions: versions.map(({ version, createdByName }) => ({
      version: version.version,
      lines: version.lines,
      note: version.note,
      ...totalsOf(version, quote.currency),
      createdAt: version.createdAt.toISOString(),
      createdByName,
    })),
    events: events.map(({ event, byName }) => ({
      fromStatus: event.fromStatus,
      toStatus: event.toStatus,
      actor: event.actor,
      byName,
      note: event.note,
      at: event.at.toISOString(),
    })),
    payUrl: payableStatuses.includes(status) ? quote.payUrl : null,
    publicLinkActive: quote.publicTokenHash !== null,
    paymentsEnabled: context.payments !== undefined,
  }
}

async function loadQuote(context: AppContext, workspaceId: string, quoteId: string): Promise<repo.QuoteRow> {
  const quote = await repo.findQuote(context.db, workspaceId, quoteId)
  if (!quote) throw notFound('Quote')
  return quote
}

export async function getQuote(context: AppContext, workspaceId: string, quoteId: string): Promise<QuoteDetail> {
  return detailOf(context, await loadQuote(context, workspaceId, quoteId))
}

export async function listQuotes(context: AppContext, workspaceId: string, filter: repo.QuoteFilter): Promise<QuoteListResponse> {
  const { rows, total } = await repo.listQuotes(context.db, workspaceId, filter)
  return { items: rows.map((row) => summaryOf(row.quote, row.totalMinor)), total, page: filter.page, pageSize: filter.pageSize }
}

/** What a job uses per run of its layout: sheets or roll length, pieces, and the cut-plan time with its cutter. */
async function jobFacts(context: AppContext, workspaceId: string, jobId: string, currency: string): Promise<{ facts: JobFactsForQuote; label: string; title: string; customerName: string }> {
  const found = await repo.findJobForQuote(context.db, workspaceId, jobId)
  if (!found) throw invalidField('body.source.jobId', 'No such job in this workspace')
  const { job, layout, stock, cutter } = found
  let cutTimePerRunS = 0
  if (layout) {
    const ids = [...new Set(layout.placements.map((placement) => placement.designId))]
    const designs = new Map((await findDesignsForCutPlan(context.db, workspaceId, ids)).map((row) => [row.id, { name: row.name, geometry: row.geometry }]))
    // Passes as the job will cut them: the material's recipe for the cutter's tool (a pen draws once).
    const passes = await passesFor(context.db, workspaceId, job.materialId, cutter?.toolKind ?? null)
    const plan = planLayout({ name: layout.name, stock: layout.stock, placements: layout.placements, options: layout.options }, designs, cutter ? profileOfCutter(cutter) : defaultCutterProfile, { ...defaultCutPlanOptions, passes })
    cutTimePerRunS = plan.totals.totalTimeS
  }
  const layoutKind = layout?.stock.kind === 'roll' ? 'roll' : 'sheet'
  const stockKind = stock ? stock.kind : layoutKind
  const sheetsPerRun = layout?.figures.sheetsUsed ?? 0
  // A sheet layout cut from a roll uses a sheet length of roll per sheet.
  const rollLengthPerRunMm = layout ? (layout.stock.kind === 'roll' ? layout.figures.usedLengthMm : sheetsPerRun * layout.stock.heightMm) : 0
  const stockName = stock?.name ?? (layout ? (layout.stock.kind === 'roll' ? `Roll ${layout.stock.widthMm} mm wide` : `Sheet ${layout.stock.widthMm} × ${layout.stock.heightMm} mm`) : 'Material')
  return {
    facts: {
      stockName,
      stockKind,
      stockPriceMinor: stock?.price === null || stock?.price === undefined ? null : toMinor(stock.price, currency),
      runs: job.quantity,
      sheetsPerRun,
      rollLengthPerRunMm,
      cutTimePerRunS,
      piecesPerRun: layout?.figures.placedCount ?? 0,
    },
    label: `Job ${job.number}: ${job.title}`,
    title: job.title,
    customerName: job.customerName,
  }
}

async function comparisonFacts(context: AppContext, workspaceId: string, comparisonId: string, stockIndex: number, currency: string) {
  const comparison = await getComparison(context, workspaceId, comparisonId).catch((error: unknown) => {
    if (error instanceof AppError && error.status === 404) throw invalidField('body.source.comparisonId', 'No such stock comparison in this workspace')
    throw error
  })
  const row = comparison.rows[stockIndex]
  if (!row) throw invalidField('body.source.stockIndex', `This comparison has ${comparison.rows.length} stocks: pick a row from 0 to ${comparison.rows.length - 1}`)
  if (!row.figures) throw invalidField('body.source.stockIndex', 'This row has no result yet: wait for its nest run to finish')
  const facts: JobFactsForQuote = {
    stockName: row.stock.label,
    stockKind: row.stock.kind === 'roll' ? 'roll' : 'sheet',
    stockPriceMinor: row.stock.price === null ? null : toMinor(row.stock.price, currency),
    runs: 1,
    sheetsPerRun: row.figures.sheetsUsed,
    rollLengthPerRunMm: row.figures.usedLengthMm,
    cutTimePerRunS: row.figures.cutTimeSeconds ?? 0,
    piecesPerRun: row.figures.placedCount,
  }
  const name = comparison.name || 'Stock comparison'
  return { facts, label: `${name}: ${row.stock.label}`, title: name }
}

export async function createQuote(context: AppContext, workspaceId: string, userId: string, body: z.output<typeof createQuoteRequestSchema>): Promise<QuoteDetail> {
  const pricing = await pricingOf(context.db, workspaceId)
  const currency = pricing.currency
  let lines: QuoteLineInput[]
  let source: QuoteSourceFacts
  let title = body.title ?? ''
  let customerName = body.customerName ?? ''
  let jobId: string | null = null
  let comparisonId: string | null = null
  if (body.source.kind === 'job') {
    const found = await jobFacts(context, workspaceId, body.source.jobId, currency)
    lines = [...draftQuoteLines(found.facts, pricing), ...(body.lines ?? [])]
    source = { kind: 'job', label: found.label }
    title ||= found.title
    customerName ||= found.customerName
    jobId = body.source.jobId
  } else if (body.source.kind === 'comparison') {
    const found = await comparisonFacts(context, workspaceId, body.source.comparisonId, body.source.stockIndex, currency)
    lines = [...draftQuoteLines(found.facts, pricing), ...(body.lines ?? [])]
    source = { kind: 'comparison', label: found.label, stockIndex: body.source.stockIndex }
    title ||= found.title
    comparisonId = body.source.comparisonId
  } else {
    if (!body.lines) throw invalidField('body.lines', 'A quote typed by hand needs at least one line')
    lines = body.lines
    source = { kind: 'manual', label: 'Typed by hand' }
  }
  const priced = priceQuote(lines, { currency, minimumOrderMinor: pricing.minimumOrderMinor, taxRatePercent: pricing.taxRatePercent })
  const quote = await context.db.transaction(async (tx) => {
    const number = await repo.nextQuoteNumber(tx, workspaceId)
    const inserted = await repo.insertQuote(tx, {
      workspaceId,
      number,
      title: title.slice(0, 120),
      jobId,
      comparisonId,
      source,
      customerName: customerName.slice(0, 120),
      customerEmail: body.customerEmail ?? '',
      currency,
      createdBy: userId,
    })
    await repo.insertVersion(tx, {
      workspaceId,
      quoteId: inserted.id,
      version: 1,
      lines: priced.lines,
      subtotalMinor: priced.subtotalMinor,
      minimumTopUpMinor: priced.minimumTopUpMinor,
      taxMinor: priced.taxMinor,
      totalMinor: priced.totalMinor,
      taxRatePercent: pricing.taxRatePercent,
      minimumOrderMinor: pricing.minimumOrderMinor,
      note: `Priced from ${source.label}`,
      createdBy: userId,
    })
    await repo.insertEvent(tx, { workspaceId, quoteId: inserted.id, fromStatus: null, toStatus: 'draft', actor: 'member', byUserId: userId, note: '' })
    return inserted
  })
  return detailOf(context, quote)
}

/** Statuses in which the price may still change; a change withdraws anything sent (back to draft). */
const editableStatuses: QuoteStatus[] = ['draft', 'sent', 'expired', 'declined']

/**
 * Changes title, customer or lines. New lines make a new version priced with the tax rate and minimum the quote was
 * made with. A quote out with the customer (sent, expired, declined) goes back to draft: its link and pay link stop
 * working, and it has to be sent again. Accepted and paid quotes are final (409).
 */
export async function updateQuote(context: AppContext, workspaceId: string, userId: string, quoteId: string, body: z.output<typeof updateQuoteRequestSchema>): Promise<QuoteDetail> {
  let withdrawnSession: string | null = null
  await context.db.transaction(async (tx) => {
    let quote = await repo.findQuote(tx, workspaceId, quoteId, { forUpdate: true })
    if (!quote) throw notFound('Quote')
    if (body.version !== quote.currentVersion) {
      throw new AppError('conflict', 409, `This quote changed meanwhile (now version ${quote.currentVersion}). Reload it and make your change again.`, undefined, { currentVersion: quote.currentVersion })
    }
    quote = await expireIfDue(tx, quote)
    if (!editableStatuses.includes(quote.status)) throw conflict(`A ${quote.status} quote cannot be changed; make a new quote instead`)
    const changes: Partial<repo.NewQuoteRow> = {}
    if (body.title !== undefined) changes.title = body.title
    if (body.customerName !== undefined) changes.customerName = body.customerName
    if (body.customerEmail !== undefined) changes.customerEmail = body.customerEmail
    if (body.lines) {
      const current = (await repo.findVersion(tx, quote.id, quote.currentVersion))!
      const priced = priceQuote(body.lines, { currency: quote.currency, minimumOrderMinor: current.minimumOrderMinor, taxRatePercent: current.taxRatePercent })
      const version = quote.currentVersion + 1
      await repo.insertVersion(tx, {
        workspaceId,
        quoteId: quote.id,
        version,
        lines: priced.lines,
        subtotalMinor: priced.subtotalMinor,
        minimumTopUpMinor: priced.minimumTopUpMinor,
        taxMinor: priced.taxMinor,
        totalMinor: priced.totalMinor,
        taxRatePercent: current.taxRatePercent,
        minimumOrderMinor: current.minimumOrderMinor,
        note: body.note ?? '',
        createdBy: userId,
      })
      changes.currentVersion = version
      if (quote.status !== 'draft') {
        withdrawnSession = quote.checkoutSessionId
        await changeStatus(tx, quote, 'draft', 'member', userId, `Changed to version ${version}: the customer link and pay link were withdrawn`, {
          publicTokenHash: null,
          checkoutSessionId: null,
          payUrl: null,
          expiresAt: null,
        })
      }
    }
    await repo.updateQuote(tx, quote.id, changes)
  })
  if (withdrawnSession) await closeCheckout(context, withdrawnSession)
  return getQuote(context, workspaceId, quoteId)
}

/** Closes a pay page that no longer matches the quote; a failure only leaves a page whose payment the webhook ignores. */
async function closeCheckout(context: AppContext, sessionId: string): Promise<void> {
  await context.payments?.expireCheckout(sessionId).catch((error: unknown) => context.logger.warn({ err: error, sessionId }, 'could not close a withdrawn pay link'))
}

function publicUrlOf(context: AppContext, token: string): string {
  return `${context.config.appUrl}/q/${token}`
}

async function createCheckoutFor(context: AppContext, quote: repo.QuoteRow, totalMinor: number, publicUrl: string, customerEmail: string | null) {
  if (!context.payments) return null
  return context.payments.createCheckout({
    amountMinor: totalMinor,
    currency: quote.currency,
    description: `Quote ${quote.number}${quote.title ? `: ${quote.title}` : ''}`,
    customerEmail,
    successUrl: `${publicUrl}?payment=done`,
    cancelUrl: `${publicUrl}?payment=cancelled`,
    metadata: { quoteId: quote.id, workspaceId: quote.workspaceId, version: String(quote.currentVersion) },
  })
}

const sendableStatuses: QuoteStatus[] = ['draft', 'sent', 'expired']

/**
 * Sends the current version: a new customer link (the old one stops working), a pay link from the provider, the PDF,
 * and the e-mail written in the same transaction as the status change.
 */
export async function sendQuote(context: AppContext, workspaceId: string, userId: string, quoteId: string, body: z.output<typeof sendQuoteRequestSchema>): Promise<QuoteDetail> {
  const before = await loadQuote(context, workspaceId, quoteId)
  if (!sendableStatuses.includes(effectiveStatus(before))) throw conflict(`A ${effectiveStatus(before)} quote cannot be sent again; make a new quote instead`)
  const version = (await repo.findVersion(context.db, before.id, before.currentVersion))!
  if (version.totalMinor <= 0) throw invalidField('body.lines', 'The total is zero or less: there is nothing to ask the customer to pay')
  const pricing = await pricingOf(context.db, workspaceId)
  const studioName = await repo.workspaceName(context.db, workspaceId)
  const token = randomBytes(32).toString('base64url')
  const publicUrl = publicUrlOf(context, token)
  const checkout = await createCheckoutFor(context, before, version.totalMinor, publicUrl, body.customerEmail).catch((error: unknown) => {
    context.logger.error({ err: error }, 'the payment provider refused a pay link')
    throw new AppError('internal', 502, 'The payment provider could not make a pay link just now. Try again in a moment.')
  })
  const customerName = body.customerName ?? before.customerName
  const sentAt = new Date()
  const expiresAt = new Date(sentAt.getTime() + pricing.quoteValidDays * 24 * 3600 * 1000)
  const quoteForPdf = { ...before, customerName, customerEmail: body.customerEmail }
  const pdf = await quotePdf({ studioName, quote: quoteForPdf, version, expiresAt, publicUrl, payUrl: checkout?.url ?? null })
  const mailId = await context.db.transaction(async (tx) => {
    const quote = await repo.findQuote(tx, workspaceId, quoteId, { forUpdate: true })
    if (!quote || quote.currentVersion !== before.currentVersion || quote.status !== before.status) {
      throw conflict('This quote changed while it was being sent. Reload it and send again.')
    }
    await changeStatus(tx, quote, 'sent', 'member', userId, `Sent version ${quote.currentVersion} to ${body.customerEmail}`, {
      customerEmail: body.customerEmail,
      customerName,
      sentAt,
      expiresAt,
      respondedAt: null,
      publicTokenHash: tokenHash(token),
      checkoutSessionId: checkout?.id ?? null,
      payUrl: checkout?.url ?? null,
    })
    return context.mail.write(
      tx,
      quoteMail({
        to: body.customerEmail,
        customerName,
        studioName,
        number: quote.number,
        title: quote.title,
        total: `${formatMinor(version.totalMinor, quote.currency)} ${quote.currency}`,
        message: body.message,
        link: publicUrl,
        payUrl: checkout?.url ?? null,
        expiresAt,
        pdf: { filename: `quote-${quote.number}.pdf`, content: pdf },
      }),
    )
  })
  await context.mail.dispatch(mailId)
  if (before.checkoutSessionId && before.checkoutSessionId !== checkout?.id) await closeCheckout(context, before.checkoutSessionId)
  return { ...(await getQuote(context, workspaceId, quoteId)), publicUrl }
}

/** Which hand-set status may follow which (effective) status. */
const manualTransitions: Record<string, QuoteStatus[]> = {
  accepted: ['sent'],
  declined: ['sent', 'accepted'],
  expired: ['sent', 'accepted'],
  paid: ['sent', 'accepted', 'expired'],
}

export async function setQuoteStatus(context: AppContext, workspaceId: string, userId: string, quoteId: string, body: z.output<typeof quoteStatusChangeRequestSchema>): Promise<QuoteDetail> {
  let closedSession: string | null = null
  await context.db.transaction(async (tx) => {
    let quote = await repo.findQuote(tx, workspaceId, quoteId, { forUpdate: true })
    if (!quote) throw notFound('Quote')
    quote = await expireIfDue(tx, quote)
    const allowedFrom = manualTransitions[body.status]!
    if (quote.status === body.status) return
    if (!allowedFrom.includes(quote.status)) throw conflict(`A ${quote.status} quote cannot be marked ${body.status} (only a ${allowedFrom.join(' or ')} one)`)
    const extra: Partial<repo.NewQuoteRow> = body.status === 'paid' ? { paidAt: new Date() } : { respondedAt: new Date() }
    if (body.status !== 'accepted') {
      closedSession = quote.checkoutSessionId
      extra.payUrl = null
      extra.checkoutSessionId = null
    }
    await changeStatus(tx, quote, body.status, 'member', userId, body.note, extra)
  })
  if (closedSession) await closeCheckout(context, closedSession)
  return getQuote(context, workspaceId, quoteId)
}

export async function quotePdfFile(context: AppContext, workspaceId: string, quoteId: string) {
  const quote = await loadQuote(context, workspaceId, quoteId)
  const version = (await repo.findVersion(context.db, quote.id, quote.currentVersion))!
  const studioName = await repo.workspaceName(context.db, workspaceId)
  const body = await quotePdf({ studioName, quote, version, expiresAt: quote.expiresAt, publicUrl: null, payUrl: null })
  return { filename: `quote-${quote.number}.pdf`, body }
}

export async function quoteSources(context: AppContext, workspaceId: string): Promise<QuoteSources> {
  const jobs = await repo.listJobsForQuotes(context.db, workspaceId)
  const comparisonIds = await repo.listComparisonIds(context.db, workspaceId)
  const comparisons = await Promise.all(comparisonIds.map((row) => getComparison(context, workspaceId, row.id)))
  return {
    jobs: jobs.map((job) => ({ id: job.id, number: job.number, title: job.title, customerName: job.customerName, status: job.status, quantity: job.quantity, hasLayout: job.layoutId !== null })),
    comparisons: comparisons
      .map((comparison) => ({
        id: comparison.id,
        name: comparison.name || 'Stock comparison',
        rows: comparison.rows.flatMap((row, stockIndex) => (row.figures ? [{ stockIndex, label: row.stock.label, complete: row.figures.complete }] : [])),
      }))
      .filter((comparison) => comparison.rows.length > 0),
  }
}

// ——— The customer's side, by the unguessable link ———

async function quoteByToken(db: DatabaseOrTransaction, token: string, options: { forUpdate?: boolean } = {}): Promise<repo.QuoteRow> {
  const quote = await repo.findQuoteByTokenHash(db, tokenHash(token), options)
  // A withdrawn link (the quote went back to draft) and a guessed one look the same.
  if (!quote || quote.status === 'draft') throw notFound('Quote')
  return quote
}

async function publicViewOf(context: AppContext, quote: repo.QuoteRow): Promise<PublicQuote> {
  const version = (await repo.findVersion(context.db, quote.id, quote.currentVersion))!
  const status = effectiveStatus(quote)
  return {
    studioName: await repo.workspaceName(context.db, quote.workspaceId),
    number: quote.number,
    title: quote.title,
    customerName: quote.customerName,
    currency: quote.currency,
    status,
    lines: customerLines(version.lines, quote.currency),
    ...totalsOf(version, quote.currency),
    sentAt: quote.sentAt?.toISOString() ?? null,
    expiresAt: quote.expiresAt?.toISOString() ?? null,
    paidAt: quote.paidAt?.toISOString() ?? null,
    canRespond: status === 'sent',
    canPay: context.payments !== undefined && payableStatuses.includes(status),
  }
}

export async function getPublicQuote(context: AppContext, token: string): Promise<PublicQuote> {
  return publicViewOf(context, await quoteByToken(context.db, token))
}

/** The customer accepts or declines a sent quote; answering twice the same way changes nothing. */
export async function respondToQuote(context: AppContext, token: string, answer: 'accepted' | 'declined'): Promise<PublicQuote> {
  let closedSession: string | null = null
  await context.db.transaction(async (tx) => {
    const quote = await expireIfDue(tx, await quoteByToken(tx, token, { forUpdate: true }))
    if (quote.status === answer) return
    if (quote.status !== 'sent') throw conflict(quote.status === 'expired' ? 'This quote has expired. Ask the studio for a new one.' : `This quote is already ${quote.status}.`)
    const extra: Partial<repo.NewQuoteRow> = { respondedAt: new Date() }
    if (answer === 'declined') {
      closedSession = quote.checkoutSessionId
      Object.assign(extra, { payUrl: null, checkoutSessionId: null })
    }
    await changeStatus(tx, quote, answer, 'customer', null, answer === 'accepted' ? 'Accepted by the customer' : 'Declined by the customer')
    await repo.updateQuote(tx, quote.id, extra)
  })
  if (closedSession) await closeCheckout(context, closedSession)
  return publicViewOf(context, await quoteByToken(context.db, token))
}

/** The pay page for the current version: the open one when there is one, else a fresh one (provider pages expire). */
export async function payLinkFor(context: AppContext, token: string): Promise<{ url: string }> {
  const quote = await quoteByToken(context.db, token)
  const status = effectiveStatus(quote)
  if (!context.payments) throw conflict('This studio takes no payments online; contact them to pay')
  if (!payableStatuses.includes(status)) throw conflict(status === 'paid' ? 'This quote is paid already.' : `A ${status} quote cannot be paid.`)
  if (quote.checkoutSessionId) {
    const session = await context.payments.retrieveCheckout(quote.checkoutSessionId).catch(() => null)
    if (session?.status === 'open' && session.url) return { url: session.url }
  }
  const version = (await repo.findVersion(context.db, quote.id, quote.currentVersion))!
  const checkout = (await createCheckoutFor(context, quote, version.totalMinor, publicUrlOf(context, token), quote.customerEmail || null))!
  await repo.updateQuote(context.db, quote.id, { checkoutSessionId: checkout.id, payUrl: checkout.url })
  return { url: checkout.url }
}

export async function publicQuotePdf(context: AppContext, token: string) {
  const quote = await quoteByToken(context.db, token)
  const version = (await repo.findVersion(context.db, quote.id, quote.currentVersion))!
  const studioName = await repo.workspaceName(context.db, quote.workspaceId)
  const body = await quotePdf({ studioName, quote, version, expiresAt: quote.expiresAt, publicUrl: null, payUrl: null })
  return { filename: `quote-${quote.number}.pdf`, body }
}

/**
 * A completed checkout from the provider's signed event. Applied only when it pays the quote's current version in
 * full, in its currency; a repeated event, a quote already paid or a stale version changes nothing.
 */
export async function recordPayment(context: AppContext, checkout: CompletedCheckout): Promise<{ applied: boolean; reason?: string }> {
  const quoteId = checkout.metadata.quoteId ?? ''
  if (!/^[0-9a-f-]{36}$/i.test(quoteId)) return { applied: false, reason: 'not a quote payment' }
  return context.db.transaction(async (tx) => {
    const quote = await repo.findQuoteById(tx, quoteId, { forUpdate: true })
    if (!quote || quote.workspaceId !== checkout.metadata.workspaceId) return { applied: false, reason: 'unknown quote' }
    if (quote.status === 'paid' || quote.paymentEventId === checkout.eventId) return { applied: false, reason: 'already paid' }
    if (!checkout.paid) return { applied: false, reason: 'not paid' }
    if (checkout.metadata.version !== String(quote.currentVersion)) return { applied: false, reason: 'an older version of the quote' }
    const version = (await repo.findVersion(tx, quote.id, quote.currentVersion))!
    if (checkout.amountMinor !== version.totalMinor || checkout.currency !== quote.currency) {
      return { applied: false, reason: `amount ${checkout.amountMinor} ${checkout.currency} does not match ${version.totalMinor} ${quote.currency}` }
    }
    await changeStatus(tx, quote, 'paid', 'payment', null, `Paid through the pay link (${formatMinor(checkout.amountMinor, quote.currency)} ${quote.currency})`, {
      paidAt: new Date(),
      paymentEventId: checkout.eventId,
      checkoutSessionId: checkout.sessionId,
    })
    return { applied: true }
  })
}
