import { and, asc, count, desc, eq, ilike, or, sql, type SQL } from 'drizzle-orm'
import type { DatabaseOrTransaction } from '../../db/client.js'
import { comparisons, cutJobs, cutters, layouts, quoteEvents, quotes, quoteVersions, stockItems, users, workspaces } from '../../db/schema/index.js'
import type { QuoteStatus } from '../../../shared/schemas/quotes.js'

export type QuoteRow = typeof quotes.$inferSelect
export type NewQuoteRow = typeof quotes.$inferInsert
export type QuoteVersionRow = typeof quoteVersions.$inferSelect

const likePattern = (text: string) => `%${text.replace(/[\\%_]/g, (match) => `\\${match}`)}%`

/** The next quote number of a workspace; the transaction-scoped lock keeps two creates from taking the same one. */
export async function nextQuoteNumber(db: DatabaseOrTransaction, workspaceId: string): Promise<number> {
  await db.execute(sql`select pg_advisory_xact_lock(hashtext(${`quotes:${workspaceId}`}))`)
  const [row] = await db.select({ value: sql<number>`coalesce(max(${quotes.number}), 0)` }).from(quotes).where(eq(quotes.workspaceId, workspaceId))
  return Number(row?.value ?? 0) + 1
}

export async function insertQuote(db: DatabaseOrTransaction, row: NewQuoteRow): Promise<QuoteRow> {
  const [inserted] = await db.insert(quotes).values(row).returning()
  return inserted!
}

export async function insertVersion(db: DatabaseOrTransaction, row: typeof quoteVersions.$inferInsert): Promise<void> {
  await db.insert(quoteVersions).values(row)
}

export async function insertEvent(db: DatabaseOrTransaction, row: typeof quoteEvents.$inferInsert): Promise<void> {
  await db.insert(quoteEvents).values(row)
}

export async function updateQuote(db: DatabaseOrTransaction, quoteId: string, changes: Partial<NewQuoteRow>): Promise<void> {
  await db
    .update(quotes)
    .set({ ...changes, updatedAt: new Date() })
    .where(eq(quotes.id, quoteId))
}

export async function findQuote(db: DatabaseOrTransaction, workspaceId: string, quoteId: string, options: { forUpdate?: boolean } = {}): Promise<QuoteRow | undefined> {
  const query = db
    .select()
    .from(quotes)
    .where(and(eq(quotes.workspaceId, workspaceId), eq(quotes.id, quoteId)))
  const [row] = options.forUpdate ? await query.for('update') : await query
  return row
}

export async function findQuoteByTokenHash(db: DatabaseOrTransaction, tokenHash: string, options: { forUpdate?: boolean } = {}): Promise<QuoteRow | undefined> {
  const query = db.select().from(quotes).where(eq(quotes.publicTokenHash, tokenHash))
  const [row] = options.forUpdate ? await query.for('update') : await query
  return row
}

export async function findQuoteById(db: DatabaseOrTransaction, quoteId: string, options: { forUpdate?: boolean } = {}): Promise<QuoteRow | undefined> {
  const query = db.select().from(quotes).where(eq(quotes.id, quoteId))
  const [row] = options.forUpdate ? await query.for('update') : await query
  return row
}

export async function findVersion(db: DatabaseOrTransaction, quoteId: string, version: number): Promise<QuoteVersionRow | undefined> {
  const [row] = await db
    .select()
    .from(quoteVersions)
    .where(and(eq(quoteVersions.quoteId, quoteId), eq(quoteVersions.version, version)))
  return row
}

export async function findVersions(db: DatabaseOrTransaction, quoteId: string) {
  return db
    .select({ version: quoteVersions, createdByName: users.name })
    .from(quoteVersions)
    .leftJoin(users, eq(users.id, quoteVersions.createdBy))
    .where(eq(quoteVersions.quoteId, quoteId))
    .orderBy(desc(quoteVersions.version))
}

export async function findEvents(db: DatabaseOrTransaction, quoteId: string) {
  return db
    .select({ event: quoteEvents, byName: users.name })
    .from(quoteEvents)
    .leftJoin(users, eq(users.id, quoteEvents.byUserId))
    .where(eq(quoteEvents.quoteId, quoteId))
    .orderBy(asc(quoteEvents.at), asc(quoteEvents.id))
}

export interface QuoteFilter {
  /** Effective status: `expired` also finds sent quotes past their expiry, `sent` leaves them out. */
  status?: QuoteStatus
  search?: string
  page: number
  pageSize: number
}

function listFilter(workspaceId: string, filter: QuoteFilter): SQL | undefined {
  const conditions: SQL[] = [eq(quotes.workspaceId, workspaceId)]
  const pastExpiry = sql`(${quotes.status} = 'sent' and ${quotes.expiresAt} is not null and ${quotes.expiresAt} < now())`
  if (filter.status === 'expired') conditions.push(or(eq(quotes.status, 'expired'), pastExpiry)!)
  else if (filter.status === 'sent') conditions.push(and(eq(quotes.status, 'sent'), sql`not ${pastExpiry}`)!)
  else if (filter.status) conditions.push(eq(quotes.status, filter.status))
  if (filter.search) {
    const pattern = likePattern(filter.search)
    conditions.push(or(ilike(quotes.title, pattern), ilike(quotes.customerName, pattern), ilike(quotes.customerEmail, pattern))!)
  }
  return and(...conditions)
}

export async function listQuotes(db: DatabaseOrTransaction, workspaceId: string, filter: QuoteFilter) {
  const where = listFilter(workspaceId, filter)
  const [rows, [total]] = await Promise.all([
    db
      .select({ quote: quotes, totalMinor: quoteVersions.totalMinor })
      .from(quotes)
      .innerJoin(quoteVersions, and(eq(quoteVersions.quoteId, quotes.id), eq(quoteVersions.version, quotes.currentVersion)))
      .where(where)
      .orderBy(desc(quotes.number))
      .limit(filter.pageSize)
      .offset((filter.page - 1) * filter.pageSize),
    db.select({ value: count() }).from(quotes).where(where),
  ])
  return { rows, total: total?.value ?? 0 }
}

export async function workspaceName(db: DatabaseOrTransaction, workspaceId: string): Promise<string> {
  const [row] = await db.select({ name: workspaces.name }).from(workspaces).where(eq(workspaces.id, workspaceId))
  return row?.name ?? ''
}

/** A job with what pricing needs: its layout, stock item and cutter, all of the same workspace. */
export async function findJobForQuote(db: DatabaseOrTransaction, workspaceId: string, jobId: string) {
  const [row] = await db
    .select({ job: cutJobs, layout: layouts, stock: stockItems, cutter: cutters })
    .from(cutJobs)
    .leftJoin(layouts, and(eq(layouts.id, cutJobs.layoutId), eq(layouts.workspaceId, workspaceId)))
    .leftJoin(stockItems, and(eq(stockItems.id, cutJobs.stockItemId), eq(stockItems.workspaceId, workspaceId)))
    .leftJoin(cutters, and(eq(cutters.id, cutJobs.cutterId), eq(cutters.workspaceId, workspaceId)))
    .where(and(eq(cutJobs.workspaceId, workspaceId), eq(cutJobs.id, jobId)))
  return row
}

export async function listJobsForQuotes(db: DatabaseOrTransaction, workspaceId: string) {
  return db
    .select({
      id: cutJobs.id,
      number: cutJobs.number,
      title: cutJobs.title,
      customerName: cutJobs.customerName,
      status: cutJobs.status,
      quantity: cutJobs.quantity,
      layoutId: cutJobs.layoutId,
    })
    .from(cutJobs)
    .where(eq(cutJobs.workspaceId, workspaceId))
    .orderBy(desc(cutJobs.number))
    .limit(200)
}

export async function listComparisonIds(db: DatabaseOrTransaction, workspaceId: string) {
  return db
    .select({ id: comparisons.id })
    .from(comparisons)
    .where(eq(comparisons.workspaceId, workspaceId))
    .orderBy(desc(comparisons.createdAt))
    .limit(20)
}
