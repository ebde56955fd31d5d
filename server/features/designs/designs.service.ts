import type { DesignDetail, DesignListResponse, DesignSummary, UploadDesignsResponse } from '../../../shared/schemas/designs.js'
import type { ImportOptions } from '../../../shared/geometry/importSvg.js'
import { defaultImportLimits, importInWorker } from './importInWorker.js'
import type { AppContext } from '../../context.js'
import { notFound } from '../../errors.js'
import * as repo from './designs.repo.js'

export interface UploadedFile {
  originalname: string
  mimetype: string
  buffer: Buffer
}

export interface Rejection {
  filename: string
  code: string
  message: string
}

function toSummary(row: repo.DesignSummaryRow): DesignSummary {
  return {
    id: row.id,
    name: row.name,
    tags: row.tags,
    originalFilename: row.originalFilename,
    widthMm: row.widthMm,
    heightMm: row.heightMm,
    bbox: { minX: row.bboxMinX, minY: row.bboxMinY, maxX: row.bboxMaxX, maxY: row.bboxMaxY },
    areaMm2: row.areaMm2,
    cutLengthMm: row.cutLengthMm,
    pieceCount: row.pieceCount,
    holeCount: row.holeCount,
    cutLineCount: row.cutLineCount,
    warningCount: row.warnings.length,
    keepTogether: row.keepTogether,
    toleranceMm: row.toleranceMm,
    preview: row.preview,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  }
}

const utf8 = new TextDecoder('utf-8', { fatal: true })

/**
 * Checks that the bytes are SVG text before any parsing: UTF-8, and an <svg> root after the optional
 * XML declaration, comments and whitespace. The extension and declared type are checked as well.
 */
export function sniffSvg(file: UploadedFile): { text: string } | Rejection {
  const reject = (code: string, message: string): Rejection => ({ filename: file.originalname, code, message })
  const byName = /\.svg$/i.test(file.originalname)
  const byType = file.mimetype === 'image/svg+xml'
  if (!byName && !byType) return reject('not_svg', 'Only SVG files (.svg) can be uploaded')
  let text: string
  try {
    text = utf8.decode(file.buffer)
  } catch {
    return reject('not_svg', 'The file is not SVG text (it is not UTF-8)')
  }
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1)
  if (text.trim().length === 0) return reject('empty', 'The file is empty')
  const head = text
    .slice(0, 4096)
    .replace(/^\s*<\?xml[^>]*\?>/, '')
    .replace(/^(\s*<!--[\s\S]*?-->)*/, '')
    .trimStart()
  if (!/^<(!DOCTYPE|svg[\s>:/]|[\w-]+:svg[\s>])/i.test(head)) return reject('not_svg', 'The file does not look like SVG: it does not start with an <svg> element')
  return { text }
}

/** Imports each file (in a worker thread); the good ones are stored in one transaction, the rest are reported with a reason. */
export async function uploadDesigns(
  context: AppContext,
  workspaceId: string,
  userId: string,
  files: UploadedFile[],
  options: ImportOptions,
): Promise<UploadDesignsResponse> {
  const rejected: Rejection[] = []
  const readable: { file: UploadedFile; text: string }[] = []
  for (const file of files) {
    const sniffed = sniffSvg(file)
    if ('code' in sniffed) rejected.push(sniffed)
    else readable.push({ file, text: sniffed.text })
  }
  const outcomes = await importInWorker(
    readable.map((entry) => entry.text),
    options,
    { ...defaultImportLimits, timeoutMs: context.config.importTimeoutMs },
  )
  const rows: repo.NewDesignRow[] = []
  outcomes.forEach((outcome, index) => {
    const file = readable[index]!.file
    if (!outcome.ok) {
      if (outcome.detail) context.logger.error({ filename: file.originalname, detail: outcome.detail }, 'design import failed')
      rejected.push({ filename: file.originalname, code: outcome.code, message: outcome.message })
      return
    }
    const { design } = outcome
    rows.push({
      workspaceId,
      name: file.originalname.replace(/\.svg$/i, '').slice(0, 120) || 'Untitled design',
      originalFilename: file.originalname.slice(0, 255),
      sanitizedSvg: outcome.sanitizedSvg,
      widthMm: design.widthMm,
      heightMm: design.heightMm,
      bboxMinX: design.bbox.minX,
      bboxMinY: design.bbox.minY,
      bboxMaxX: design.bbox.maxX,
      bboxMaxY: design.bbox.maxY,
      areaMm2: design.areaMm2,
      cutLengthMm: design.cutLengthMm,
      pieceCount: design.pieces.length,
      holeCount: design.holeCount,
      cutLineCount: design.cutLines.length,
      toleranceMm: design.toleranceMm,
      geometry: { pieces: design.pieces, cutLines: design.cutLines },
      preview: outcome.preview,
      warnings: design.warnings,
      createdBy: userId,
    })
  })
  const inserted = await context.db.transaction((tx) => repo.insertDesigns(tx, rows))
  return { designs: inserted.map(toSummary), rejected }
}

export async function listDesigns(
  context: AppContext,
  workspaceId: string,
  query: { search?: string; tag?: string; page: number; pageSize: number },
): Promise<DesignListResponse> {
  const [{ rows, total }, tags] = await Promise.all([repo.listDesigns(context.db, workspaceId, query), repo.listWorkspaceTags(context.db, workspaceId)])
  return { items: rows.map(toSummary), total, page: query.page, pageSize: query.pageSize, tags }
}

export async function getDesign(context: AppContext, workspaceId: string, designId: string): Promise<DesignDetail> {
  const found = await repo.findDesign(context.db, workspaceId, designId)
  if (!found) throw notFound('Design')
  const { design } = found
  return { ...toSummary(design), geometry: design.geometry, warnings: design.warnings, createdByName: found.createdByName }
}

export async function getOriginal(context: AppContext, workspaceId: string, designId: string) {
  const found = await repo.findDesign(context.db, workspaceId, designId)
  if (!found) throw notFound('Design')
  return { filename: found.design.originalFilename, svg: found.design.sanitizedSvg }
}

export async function updateDesign(
  context: AppContext,
  workspaceId: string,
  designId: string,
  changes: { name?: string; tags?: string[]; keepTogether?: boolean },
): Promise<DesignDetail> {
  const tags = changes.tags ? [...new Set(changes.tags)] : undefined
  const updated = await repo.updateDesign(context.db, workspaceId, designId, { ...changes, ...(tags ? { tags } : {}) })
  if (!updated) throw notFound('Design')
  return getDesign(context, workspaceId, designId)
}

export async function deleteDesign(context: AppContext, workspaceId: string, designId: string): Promise<void> {
  const deleted = await repo.deleteDesign(context.db, workspaceId, designId)
  if (!deleted) throw notFound('Design')
}
