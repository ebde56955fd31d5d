// Nests a benchmark or job file from the command line:
//   npm run --silent nest -- --instance FILE.json --seconds 30 --seed 1 --out result.json
// FILE.json is the ESICUP JSON of the team's data folder, optionally with "mode": "sheets", "sheet": {width, height},
// "margin", "spacing", per-piece "rotations" and "holes". Prints one summary line; exits 1 on invalid input.
import { readFileSync, writeFileSync } from 'node:fs'
import { parseArgs } from 'node:util'
import { z } from 'zod'
import { runNestInThreads, NestRunError } from '../server/features/nesting/runInThreads.js'
import type { NestProblem } from '../shared/nesting/types.js'

const point = z.tuple([z.number(), z.number()])
const instanceSchema = z.object({
  name: z.string().optional(),
  stripWidth: z.number().positive().optional(),
  rotations: z.array(z.number()).default([0]),
  mode: z.enum(['roll', 'sheets']).default('roll'),
  sheet: z.object({ width: z.number().positive(), height: z.number().positive() }).optional(),
  margin: z.number().min(0).default(0),
  spacing: z.number().min(0).default(0),
  pieces: z
    .array(
      z.object({
        id: z.string(),
        quantity: z.number().int().min(0),
        polygon: z.array(point).min(3),
        holes: z.array(z.array(point).min(3)).optional(),
        rotations: z.array(z.number()).optional(),
      }),
    )
    .min(1),
})
export type NestInstance = z.infer<typeof instanceSchema>

export function problemFromInstance(instance: NestInstance): NestProblem {
  if (instance.mode === 'sheets' && !instance.sheet) throw new Error('"mode": "sheets" needs "sheet": { "width", "height" }')
  if (instance.mode === 'roll' && !instance.stripWidth) throw new Error('a roll instance needs "stripWidth"')
  return {
    items: instance.pieces.map((piece) => ({ id: piece.id, outline: piece.polygon, holes: piece.holes, quantity: piece.quantity, rotationsDeg: piece.rotations ?? instance.rotations })),
    stock: instance.mode === 'sheets' ? { kind: 'sheets', width: instance.sheet!.width, height: instance.sheet!.height } : { kind: 'roll', width: instance.stripWidth! },
    margin: instance.margin,
    spacing: instance.spacing,
  }
}

export function readInstance(file: string): NestInstance {
  let json: unknown
  try {
    json = JSON.parse(readFileSync(file, 'utf8'))
  } catch (error) {
    throw new Error(`${file} is not a readable JSON file (${error instanceof Error ? error.message.split('\n')[0] : error})`)
  }
  const parsed = instanceSchema.safeParse(json)
  if (!parsed.success) throw new Error(parsed.error.issues.map((issue) => `${issue.path.join('.') || 'file'}: ${issue.message}`).join('; '))
  return parsed.data
}

async function main() {
  const { values } = parseArgs({
    options: { instance: { type: 'string' }, seconds: { type: 'string', default: '30' }, seed: { type: 'string', default: '1' }, out: { type: 'string' }, threads: { type: 'string' } },
  })
  if (!values.instance) throw new Error('give --instance FILE.json')
  const seconds = Number(values.seconds)
  const seed = Number(values.seed)
  if (!(seconds > 0)) throw new Error('--seconds must be a number above 0')
  if (!Number.isInteger(seed) || seed < 1) throw new Error('--seed must be a whole number of 1 or more')
  const instance = readInstance(values.instance)
  const problem = problemFromInstance(instance)
  const { result } = await runNestInThreads(problem, { timeBudgetMs: seconds * 1000, seed, threads: values.threads ? Number(values.threads) : undefined })
  const output = {
    mode: result.mode,
    ...(result.mode === 'sheets' ? { sheets: result.sheetCount } : { length: result.length }),
    density: result.utilisation,
    placements: result.placements.map((placement) => ({
      id: placement.itemId,
      copy: placement.copy,
      sheet: placement.sheet,
      angle: placement.angleDeg,
      mirrored: placement.mirrored,
      x: placement.x,
      y: placement.y,
      polygon: placement.outline,
      holes: placement.holes,
    })),
    unplaced: result.unplaced,
  }
  if (values.out) writeFileSync(values.out, JSON.stringify(output))
  const size = result.mode === 'sheets' ? `${result.sheetCount} sheets, last used to ${result.length.toFixed(2)}` : `length ${result.length.toFixed(3)}`
  console.log(
    `${instance.name ?? values.instance}: ${result.placements.length} placed${result.unplaced.length ? `, ${result.unplaced.length} unplaced` : ''}, ${size}, density ${(result.utilisation * 100).toFixed(2)} %, ${result.evaluations} layouts in ${(result.elapsedMs / 1000).toFixed(1)} s, verified`,
  )
}

if (import.meta.url === `file://${process.argv[1]}`) {
  main().catch((error: unknown) => {
    const message = error instanceof NestRunError || error instanceof Error ? error.message : String(error)
    console.error(`nest: ${message}`)
    process.exit(1)
  })
}
