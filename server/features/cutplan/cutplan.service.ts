import type { DesignForCutPlan } from '../../../shared/cutplan/contours.js'
import { planLayout, type LayoutCutPlan as Plan } from '../../../shared/cutplan/plan.js'
import { cutPlanOptionsSchema, profileWith, type CutterProfile } from '../../../shared/cutplan/profile.js'
import { sheetToHpgl } from '../../../shared/cutplan/hpgl.js'
import { sheetToSvg } from '../../../shared/cutplan/svg.js'
import type { CutPlanExportQuery, CutPlanQuery, CutPlanResponse } from '../../../shared/schemas/cutplan.js'
import type { AppContext } from '../../context.js'
import { invalidField, notFound } from '../../errors.js'
import { findLayout } from '../layouts/layouts.repo.js'
import { findDesignsForCutPlan, findMaterialWithRecipe } from './cutplan.repo.js'
import { findCutter } from '../cutters/cutters.repo.js'
import { profileOfCutter } from '../cutters/cutterProfile.js'
import { jobSheetPdf } from './jobSheet.js'

interface PlannedLayout {
  layout: NonNullable<Awaited<ReturnType<typeof findLayout>>>['layout']
  designs: Map<string, DesignForCutPlan>
  plan: Plan
}

/** Reads the saved layout and its designs and plans every sheet with the default (or chosen cutter's) profile and the query's overrides. */
async function planSavedLayout(context: AppContext, workspaceId: string, layoutId: string, query: CutPlanQuery): Promise<PlannedLayout> {
  const found = await findLayout(context.db, workspaceId, layoutId)
  if (!found) throw notFound('Layout')
  const { layout } = found
  const ids = [...new Set(layout.placements.map((placement) => placement.designId))]
  const rows = await findDesignsForCutPlan(context.db, workspaceId, ids)
  const designs = new Map(rows.map((row) => [row.id, { name: row.name, geometry: row.geometry }]))
  // A chosen cutter gives the base profile; values in the query still override it (e.g. a slower speed for one job).
  let base: Partial<CutterProfile> = {}
  if (query.cutterId) {
    const cutter = await findCutter(context.db, workspaceId, query.cutterId)
    if (!cutter) throw invalidField('query.cutterId', 'No such cutter in this workspace')
    base = profileOfCutter(cutter)
  }
  const overrides: Partial<CutterProfile> = {
    cutSpeedMmS: query.cutSpeedMmS,
    travelSpeedMmS: query.travelSpeedMmS,
    accelerationMmS2: query.accelerationMmS2,
    liftLowerS: query.liftLowerS,
    cornerAngleDeg: query.cornerAngleDeg,
    origin: query.origin,
    swapAxes: query.swapAxes,
  }
  const profile = profileWith({ ...base, ...Object.fromEntries(Object.entries(overrides).filter(([, value]) => value !== undefined)) })
  const options = cutPlanOptionsSchema.parse({
    passes: query.passes,
    overcutMm: query.overcutMm,
    order: query.order,
    commonLine: query.commonLine,
    weedingGapMm: query.weedingGapMm,
    weedingLines: query.weedingLines,
  })
  return { layout, designs, plan: planLayout({ name: layout.name, stock: layout.stock, placements: layout.placements, options: layout.options }, designs, profile, options) }
}

export async function getCutPlan(context: AppContext, workspaceId: string, layoutId: string, query: CutPlanQuery): Promise<CutPlanResponse> {
  const { layout, plan } = await planSavedLayout(context, workspaceId, layoutId, query)
  return {
    layoutId: layout.id,
    layoutName: layout.name,
    version: layout.version,
    profile: plan.profile,
    options: plan.options,
    sheets: plan.sheets.map((sheet) => sheet.figures),
    totals: plan.totals,
  }
}

export interface ExportFile {
  contentType: string
  filename: string
  body: string | Buffer
}

/** A file name people can keep: the layout's name reduced to safe characters, the sheet number counted from 1. */
function fileStem(name: string): string {
  const safe = name
    .normalize('NFKD')
    .replace(/[^\w\s-]/g, '')
    .trim()
    .replace(/\s+/g, '-')
    .toLowerCase()
    .slice(0, 60)
  return safe || 'layout'
}

/** The recipe as a maker reads it at the machine: blade, force, passes and speed, or laser power. */
export function recipeInWords(recipe: { toolKind: 'blade' | 'laser'; bladeType: string | null; bladeAngleDeg: number | null; force: number | null; passes: number; speedMmS: number; powerPercent: number | null }): string {
  const passes = `${recipe.passes} ${recipe.passes === 1 ? 'pass' : 'passes'}`
  if (recipe.toolKind === 'laser') return [`power ${recipe.powerPercent ?? '?'} %`, `speed ${recipe.speedMmS} mm/s`, passes].join(', ')
  const blade = recipe.bladeType ? `${recipe.bladeType} blade${recipe.bladeAngleDeg !== null ? ` ${recipe.bladeAngleDeg}°` : ''}` : 'blade not set'
  return [blade, `force ${recipe.force ?? 'not set'}`, passes, `speed ${recipe.speedMmS} mm/s`].join(', ')
}

/** The material named on a job sheet, with its recipe for the chosen cutter's tool (a blade unless the cutter is a laser). */
async function materialForJobSheet(context: AppContext, workspaceId: string, materialId: string, cutterId: string | undefined): Promise<{ name: string; recipeText: string }> {
  const cutter = cutterId ? await findCutter(context.db, workspaceId, cutterId) : undefined
  const toolKind = cutter?.toolKind === 'laser' ? 'laser' : 'blade'
  const found = await findMaterialWithRecipe(context.db, workspaceId, materialId, toolKind)
  if (!found) throw invalidField('query.materialId', 'No such material in this workspace')
  return { name: found.name, recipeText: found.recipe ? recipeInWords(found.recipe) : `no ${toolKind} recipe recorded for this material` }
}

export async function exportCutPlan(context: AppContext, workspaceId: string, layoutId: string, query: CutPlanExportQuery): Promise<ExportFile> {
  const { layout, designs, plan } = await planSavedLayout(context, workspaceId, layoutId, query)
  const sheetCount = plan.sheets.length
  if (query.sheet === undefined && query.format !== 'pdf') throw invalidField('query.sheet', `Choose a sheet (0 to ${sheetCount - 1}): ${query.format.toUpperCase()} files hold one sheet each`)
  if (query.sheet !== undefined && query.sheet >= sheetCount) {
    throw invalidField('query.sheet', sheetCount === 1 ? 'This layout has one sheet: use sheet 0' : `This layout has ${sheetCount} sheets: use a sheet from 0 to ${sheetCount - 1}`)
  }
  const stem = fileStem(layout.name)
  const sheetPart = query.sheet === undefined ? '' : `-sheet-${query.sheet + 1}`
  if (query.format === 'svg') {
    const sheet = plan.sheets[query.sheet!]!
    return { contentType: 'image/svg+xml; charset=utf-8', filename: `${stem}${sheetPart}.svg`, body: sheetToSvg(sheet, `${layout.name} · sheet ${query.sheet! + 1}`) }
  }
  if (query.format === 'hpgl') {
    return { contentType: 'application/vnd.hp-hpgl', filename: `${stem}${sheetPart}.plt`, body: sheetToHpgl(plan.sheets[query.sheet!]!, plan.profile) }
  }
  const sheets = query.sheet === undefined ? plan.sheets : [plan.sheets[query.sheet]!]
  const material = query.materialId ? await materialForJobSheet(context, workspaceId, query.materialId, query.cutterId) : undefined
  const body = await jobSheetPdf({ layoutName: layout.name, stock: layout.stock, plan, sheets, designs, placements: layout.placements, material })
  return { contentType: 'application/pdf', filename: `${stem}${sheetPart}-job-sheet.pdf`, body }
}
