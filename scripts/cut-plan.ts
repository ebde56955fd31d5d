// Cut plan figures of a nesting CLI result:
//   npm run --silent cut-plan -- --layout result.json [--profile profile.json] [--instance FILE.json] [--passes N]
//     [--overcut MM] [--common-line] [--weeding-gap MM] [--weeding-lines] [--json]
// result.json is what `npm run nest -- --out` writes (placed outlines in stock coordinates). The sheet size comes from
// the instance file when given (its "sheet" or "stripWidth"), else from the extent of the placed pieces. profile.json
// holds any cutter profile values to change (cutSpeedMmS, travelSpeedMmS, accelerationMmS2, liftLowerS, origin, …).
// Prints one line per sheet, or with --json the figures per sheet and the totals. Exits 1 on invalid input.
import { readFileSync } from 'node:fs'
import { parseArgs } from 'node:util'
import { z } from 'zod'
import type { DesignForCutPlan, LayoutForCutPlan } from '../shared/cutplan/contours.js'
import { planLayout } from '../shared/cutplan/plan.js'
import { cutPlanOptionsSchema, cutterProfileSchema, profileWith } from '../shared/cutplan/profile.js'
import { boundingBox, perimeter, signedArea } from '../shared/geometry/polygon.js'

const point = z.tuple([z.number(), z.number()])
const nestResultSchema = z.object({
  mode: z.enum(['roll', 'sheets', 'polygon']),
  placements: z.array(
    z.object({
      id: z.string(),
      copy: z.number().int().default(0),
      sheet: z.number().int().min(0).default(0),
      polygon: z.array(point).min(3),
      holes: z.array(z.array(point)).default([]),
    }),
  ),
})
const instanceSizeSchema = z.object({ stripWidth: z.number().positive().optional(), sheet: z.object({ width: z.number().positive(), height: z.number().positive() }).optional(), margin: z.number().min(0).default(0) })

function readJson(file: string, what: string): unknown {
  try {
    return JSON.parse(readFileSync(file, 'utf8'))
  } catch (error) {
    throw new Error(`${what} ${file} is not a readable JSON file (${error instanceof Error ? error.message.split('\n')[0] : error})`)
  }
}

function parsed<T extends z.ZodType>(schema: T, value: unknown, file: string): z.output<T> {
  const result = schema.safeParse(value)
  if (!result.success) throw new Error(`${file}: ${result.error.issues.map((issue) => `${issue.path.join('.') || 'file'}: ${issue.message}`).join('; ')}`)
  return result.data
}

/** Each placed outline becomes a one-piece design at the origin: the nest result already holds stock coordinates. */
export function layoutFromNestResult(result: z.output<typeof nestResultSchema>, size: z.output<typeof instanceSizeSchema> | undefined): { layout: LayoutForCutPlan; designs: Map<string, DesignForCutPlan> } {
  const designs = new Map<string, DesignForCutPlan>()
  const placements = result.placements.map((placement, index) => {
    const designId = `placed-${index}`
    const outline = signedArea(placement.polygon) < 0 ? [...placement.polygon].reverse() : placement.polygon
    designs.set(designId, {
      name: `${placement.id} #${placement.copy + 1}`,
      geometry: {
        pieces: [{ outline, holes: placement.holes, areaMm2: 0, cutLengthMm: perimeter(outline) + placement.holes.reduce((sum, hole) => sum + perimeter(hole), 0), bbox: boundingBox(outline) }],
        cutLines: [],
      },
    })
    return { id: `${placement.id}-${placement.copy}`, designId, pieceIndex: 0, sheet: placement.sheet, xMm: 0, yMm: 0, angleDeg: 0, mirrored: false }
  })
  const extent = boundingBox(result.placements.flatMap((placement) => placement.polygon))
  const margin = size?.margin ?? 0
  const sheetCount = Math.max(1, ...result.placements.map((placement) => placement.sheet + 1))
  const layout: LayoutForCutPlan =
    result.mode === 'roll'
      ? { stock: { kind: 'roll', widthMm: size?.stripWidth ?? Math.max(1, extent.maxY + margin), lengthMm: Math.max(1, extent.maxX + margin) }, placements, options: { marginMm: margin } }
      : {
          stock: { kind: 'sheets', widthMm: size?.sheet?.width ?? Math.max(1, extent.maxX + margin), heightMm: size?.sheet?.height ?? Math.max(1, extent.maxY + margin), sheetCount },
          placements,
          options: { marginMm: margin },
        }
  return { layout, designs }
}

async function main() {
  const { values } = parseArgs({
    options: {
      layout: { type: 'string' },
      profile: { type: 'string' },
      instance: { type: 'string' },
      passes: { type: 'string' },
      overcut: { type: 'string' },
      'common-line': { type: 'boolean', default: false },
      'weeding-gap': { type: 'string' },
      'weeding-lines': { type: 'boolean', default: false },
      json: { type: 'boolean', default: false },
    },
  })
  if (!values.layout) throw new Error('give --layout result.json (the output of npm run nest -- --out)')
  const result = parsed(nestResultSchema, readJson(values.layout, 'layout'), values.layout)
  const size = values.instance ? parsed(instanceSizeSchema, readJson(values.instance, 'instance'), values.instance) : undefined
  const profile = values.profile ? profileWith(parsed(cutterProfileSchema.partial(), readJson(values.profile, 'profile'), values.profile)) : profileWith()
  const options = parsed(
    cutPlanOptionsSchema,
    { passes: values.passes, overcutMm: values.overcut, commonLine: values['common-line'], weedingGapMm: values['weeding-gap'], weedingLines: values['weeding-lines'] },
    'options',
  )
  const { layout, designs } = layoutFromNestResult(result, size)
  const plan = planLayout(layout, designs, profile, options)
  if (values.json) {
    console.log(JSON.stringify({ profile: plan.profile, options: plan.options, sheets: plan.sheets.map((sheet) => sheet.figures), totals: plan.totals }, null, 2))
    return
  }
  for (const { figures } of plan.sheets) {
    const saving = figures.travelInPlacementOrderMm > 0 ? (1 - figures.travelLengthMm / figures.travelInPlacementOrderMm) * 100 : 0
    console.log(
      `sheet ${figures.sheet + 1}: ${figures.contourCount} contours, cut ${(figures.cutLengthMm / 1000).toFixed(2)} m, travel ${(figures.travelLengthMm / 1000).toFixed(2)} m (${saving.toFixed(0)} % less than placement order), ${figures.lifts} lifts, ${(figures.totalTimeS / 60).toFixed(1)} min`,
    )
  }
  console.log(`total: cut ${(plan.totals.cutLengthMm / 1000).toFixed(2)} m, travel ${(plan.totals.travelLengthMm / 1000).toFixed(2)} m, ${plan.totals.lifts} lifts, ${(plan.totals.totalTimeS / 60).toFixed(1)} min (profile: ${profile.name})`)
}

if (import.meta.url === `file://${process.argv[1]}`) {
  main().catch((error: unknown) => {
    console.error(`cut-plan: ${error instanceof Error ? error.message : String(error)}`)
    process.exit(1)
  })
}
