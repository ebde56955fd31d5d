import { z } from 'zod'
import { createStockRequestSchema, type StockItem, type StockListResponse, type UpdateStockRequest, type updateStockRequestSchema } from '../../../shared/schemas/stock.js'
import type { AppContext } from '../../context.js'
import { AppError, conflict, invalidField, notFound } from '../../errors.js'
import { isForeignKeyViolation } from '../../db/errors.js'
import { zodFieldMessages } from '../../middleware/parseRequest.js'
import * as repo from './stock.repo.js'

type ValidStock = z.output<typeof createStockRequestSchema>

function toStockItem({ item, materialName, materialCategory }: repo.StockRowWithMaterial): StockItem {
  return {
    id: item.id,
    name: item.name,
    kind: item.kind,
    widthMm: item.widthMm,
    heightMm: item.kind === 'sheet' ? item.heightMm : null,
    lengthMm: item.kind === 'roll' ? item.lengthMm : null,
    margins: { topMm: item.marginTopMm, rightMm: item.marginRightMm, bottomMm: item.marginBottomMm, leftMm: item.marginLeftMm },
    material: item.materialId && materialName !== null ? { id: item.materialId, name: materialName, category: materialCategory ?? 'other' } : null,
    price: item.price,
    priceUnit: item.kind === 'sheet' ? 'sheet' : 'metre',
    quantityOnHand: item.quantityOnHand,
    supplierNote: item.supplierNote,
    archived: item.archivedAt !== null,
    isRemnant: item.isRemnant,
    remnantOfJobId: item.remnantOfJobId,
    outline: item.outline ?? null,
    createdAt: item.createdAt.toISOString(),
    updatedAt: item.updatedAt.toISOString(),
  }
}

function columnsOf(stock: ValidStock): Omit<repo.NewStockRow, 'workspaceId'> {
  return {
    name: stock.name,
    kind: stock.kind,
    widthMm: stock.widthMm,
    heightMm: stock.kind === 'sheet' ? stock.heightMm : null,
    lengthMm: stock.kind === 'roll' ? stock.lengthMm : null,
    marginTopMm: stock.margins.topMm,
    marginRightMm: stock.margins.rightMm,
    marginBottomMm: stock.margins.bottomMm,
    marginLeftMm: stock.margins.leftMm,
    materialId: stock.materialId,
    price: stock.price,
    quantityOnHand: stock.quantityOnHand,
    supplierNote: stock.supplierNote,
  }
}

async function checkMaterial(context: AppContext, workspaceId: string, materialId: string | null): Promise<void> {
  if (materialId === null) return
  if (!(await repo.materialInWorkspace(context.db, workspaceId, materialId))) {
    throw invalidField('body.materialId', 'No such material in this workspace')
  }
}

export async function listStock(context: AppContext, workspaceId: string, filter: repo.StockFilter): Promise<StockListResponse> {
  const { rows, total } = await repo.listStock(context.db, workspaceId, filter)
  return { items: rows.map(toStockItem), total, page: filter.page, pageSize: filter.pageSize }
}

export async function getStock(context: AppContext, workspaceId: string, stockId: string): Promise<StockItem> {
  const found = await repo.findStock(context.db, workspaceId, stockId)
  if (!found) throw notFound('Stock item')
  return toStockItem(found)
}

export async function createStock(context: AppContext, workspaceId: string, userId: string, stock: ValidStock): Promise<StockItem> {
  await checkMaterial(context, workspaceId, stock.materialId)
  const { id } = await repo.insertStock(context.db, { ...columnsOf(stock), workspaceId, createdBy: userId })
  return getStock(context, workspaceId, id)
}

/** The stored item with the change laid over it, checked as a whole: a new width must still fit the margins. */
export async function updateStock(context: AppContext, workspaceId: string, stockId: string, changes: z.output<typeof updateStockRequestSchema>): Promise<StockItem> {
  const current = await getStock(context, workspaceId, stockId)
  const kind = changes.kind ?? current.kind
  const merged = {
    kind,
    name: changes.name ?? current.name,
    widthMm: changes.widthMm ?? current.widthMm,
    ...(kind === 'sheet' ? { heightMm: changes.heightMm ?? current.heightMm ?? undefined } : { lengthMm: changes.lengthMm ?? current.lengthMm ?? undefined }),
    materialId: changes.materialId === undefined ? (current.material?.id ?? null) : changes.materialId,
    margins: { ...current.margins, ...stripUndefined(changes.margins ?? {}) },
    price: changes.price === undefined ? current.price : changes.price,
    quantityOnHand: changes.quantityOnHand ?? current.quantityOnHand,
    supplierNote: changes.supplierNote ?? current.supplierNote,
  } satisfies UpdateStockRequest
  const checked = createStockRequestSchema.safeParse(merged)
  if (!checked.success) {
    const fields = zodFieldMessages(checked.error, 'body')
    const [first] = Object.keys(fields)
    throw new AppError('validation_failed', 400, `Check ${Object.keys(fields).join(', ')}: ${fields[first!]![0]}`, fields)
  }
  if (changes.materialId !== undefined) await checkMaterial(context, workspaceId, checked.data.materialId)
  const archivedAt = changes.archived === undefined ? {} : { archivedAt: changes.archived ? new Date() : null }
  const updated = await repo.updateStock(context.db, workspaceId, stockId, { ...columnsOf(checked.data), ...archivedAt })
  if (!updated) throw notFound('Stock item')
  return getStock(context, workspaceId, stockId)
}

function stripUndefined<T extends Record<string, unknown>>(value: T): Partial<T> {
  return Object.fromEntries(Object.entries(value).filter(([, entry]) => entry !== undefined)) as Partial<T>
}

/**
 * Deletes a stock item nothing refers to. Layouts and jobs that use an item refer to it by foreign key, so the
 * database itself refuses the delete then, and the answer says to archive it instead.
 */
export async function deleteStock(context: AppContext, workspaceId: string, stockId: string): Promise<void> {
  try {
    const deleted = await repo.deleteStock(context.db, workspaceId, stockId)
    if (!deleted) throw notFound('Stock item')
  } catch (error) {
    if (isForeignKeyViolation(error)) throw conflict('This stock item is used by layouts or jobs; archive it instead of deleting it')
    throw error
  }
}
