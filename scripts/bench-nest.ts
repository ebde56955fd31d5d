// Nesting benchmark: every ESICUP instance of the team's data folder in roll mode with its own rotations, plus the
// time to a first feasible layout of a 300-piece craft set made from the demo designs. Prints a table and rewrites
// its section of docs/benchmarks.md.   npm run bench:nest -- --seconds 30
import { readdirSync, readFileSync, writeFileSync } from 'node:fs'
import { cpus, loadavg, totalmem } from 'node:os'
import path from 'node:path'
import { parseArgs } from 'node:util'
import { importSvg } from '../shared/geometry/importSvg.js'
import { signedArea } from '../shared/geometry/polygon.js'
import { nest } from '../shared/nesting/nest.js'
import { verifyLayout } from '../shared/nesting/verify.js'
import type { NestItem } from '../shared/nesting/types.js'
import { runNestInThreads } from '../server/features/nesting/runInThreads.js'
import { problemFromInstance, readInstance } from './nest.js'

const { values } = parseArgs({ options: { seconds: { type: 'string', default: '30' }, seed: { type: 'string', default: '1' }, data: { type: 'string', default: '../shared/data/esicup' }, 'no-write': { type: 'boolean', default: false } } })
const seconds = Number(values.seconds)
const seed = Number(values.seed)

// Best-known densities from the team's REFERENCES.md (Elkeran 2013, EJOR 231; values from memory, as marked there).
const bestKnown: Record<string, number> = { dagli: 89.5, fu: 92.4, jakobs1: 89.1, jakobs2: 87.7, marques: 90.6, shapes0: 68.8, shirts: 89.0 }

const ringArea = (ring: [number, number][]) => Math.abs(signedArea(ring))

const rows: string[] = []
const gaps: number[] = []
for (const file of readdirSync(values.data).filter((name) => name.endsWith('.json')).sort()) {
  const name = file.replace(/\.json$/, '')
  const instance = readInstance(path.join(values.data, file))
  const problem = problemFromInstance(instance)
  const pieceCount = instance.pieces.reduce((sum, piece) => sum + piece.quantity, 0)
  const area = instance.pieces.reduce((sum, piece) => sum + ringArea(piece.polygon) * piece.quantity, 0)
  const { result, verification } = await runNestInThreads(problem, { timeBudgetMs: seconds * 1000, seed })
  const density = (area / (instance.stripWidth! * result.length)) * 100
  const best = bestKnown[name]
  const gap = best === undefined ? undefined : best - density
  if (gap !== undefined) gaps.push(gap)
  const row = `| ${name} | ${pieceCount} | ${result.length.toFixed(3)} | ${density.toFixed(2)} % | ${(area / instance.stripWidth!).toFixed(2)} | ${best?.toFixed(1) ?? '–'} % | ${gap?.toFixed(2) ?? '–'} | ${result.firstFeasibleMs} ms | ${result.evaluations} | ${verification.ok ? 'yes' : 'NO'} |`
  rows.push(row)
  console.log(row)
}
const meanGap = gaps.reduce((sum, gap) => sum + gap, 0) / gaps.length
const worstGap = Math.max(...gaps)

// A craft set: the demo designs' pieces, 300 in all, on a 610 mm (24 in) roll with 2 mm spacing and 5 mm margin.
const designs = readdirSync('fixtures/designs')
  .filter((name) => name.endsWith('.svg'))
  .sort()
  .map((name) => importSvg(readFileSync(path.join('fixtures/designs', name), 'utf8')))
const pieces = designs.flatMap((design, designIndex) => design.pieces.map((piece, pieceIndex) => ({ id: `${designIndex}:${pieceIndex}`, piece })))
const items: NestItem[] = pieces.map(({ id, piece }, index) => ({
  id,
  outline: piece.outline,
  holes: piece.holes,
  quantity: Math.floor(300 / pieces.length) + (index < 300 % pieces.length ? 1 : 0),
  rotationsDeg: [0, 90, 180, 270],
}))
// The same search outlines as a nest run of designs (shared/nesting/designItems.ts).
const craftProblem = { items, stock: { kind: 'roll' as const, width: 610 }, spacing: 2, margin: 5, simplifyTolerance: 0.1 }
// First the quick layout alone (a 1 ms budget stops the search right after it), checked like any result; then the
// first true-shape construction, timed on its own.
const quick = nest(craftProblem, { timeBudgetMs: 1, seed })
const quickCheck = verifyLayout(craftProblem, quick)
const trueStarted = performance.now()
const trueShape = nest(craftProblem, { maxEvaluations: 2, timeBudgetMs: 120_000, seed })
const trueShapeMs = performance.now() - trueStarted
const trueCheck = verifyLayout(craftProblem, trueShape)
const describe = (result: typeof quick) =>
  result.unplaced.length === 0 ? `length ${result.length.toFixed(1)} mm, utilisation ${(result.utilisation * 100).toFixed(1)} %` : `${result.placements.length} of 300 placed`
const craftLine =
  `300-piece craft set (${pieces.length} piece shapes from ${designs.length} demo designs, 4 rotations, 610 mm roll, 2 mm spacing): ` +
  `first feasible layout (bounding octagons) in ${quick.firstFeasibleMs} ms, ${describe(quick)}, verified ${quickCheck.ok ? 'yes' : 'NO'}; ` +
  `first true-shape layout in ${(trueShapeMs / 1000).toFixed(1)} s, ${describe(trueShape)}, verified ${trueCheck.ok ? 'yes' : 'NO'}`
console.log(`mean gap ${meanGap.toFixed(2)} points, worst ${worstGap.toFixed(2)} points`)
console.log(craftLine)

if (!values['no-write']) {
  const section = [
    '<!-- bench:nest:start -->',
    `## Nesting (\`npm run bench:nest -- --seconds ${seconds}\`)`,
    '',
    `ESICUP instances (team data folder), roll mode, the instance's rotations, ${seconds} s per instance, two worker threads with seeds ${seed} and ${seed + 1}, best of the two. Density = piece area / (strip width × length). Best-known densities: REFERENCES.md (from memory there).`,
    '',
    '| instance | pieces | length | density | area bound on length | best-known | gap (points) | first feasible | layouts evaluated | verified |',
    '| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |',
    ...rows,
    '',
    `Mean gap to best-known: **${meanGap.toFixed(2)} points**; worst: **${worstGap.toFixed(2)} points** (targets: ≤ 6 and ≤ 10).`,
    '',
    craftLine + ' (target: under 2 s).',
    '',
    `Machine: ${cpus()[0]?.model ?? 'unknown'}, ${cpus().length} cores, ${(totalmem() / 2 ** 30).toFixed(1)} GiB, Node ${process.version}; load average ${loadavg()[0]!.toFixed(2)} at the end; ${new Date().toISOString().slice(0, 10)}.`,
    '<!-- bench:nest:end -->',
  ].join('\n')
  const file = 'docs/benchmarks.md'
  const current = readFileSync(file, 'utf8')
  const pattern = /<!-- bench:nest:start -->[\s\S]*<!-- bench:nest:end -->/
  writeFileSync(file, pattern.test(current) ? current.replace(pattern, section) : `${current.trimEnd()}\n\n${section}\n`)
}
