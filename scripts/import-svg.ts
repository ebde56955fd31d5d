// Reads one SVG file with the same importer the server uses and prints what would be cut:
//   npm run --silent import-svg -- FILE.svg [--tolerance 0.02] [--min-speck 0.5] [--json]
// Exit codes: 0 read, 1 the file cannot be used as a design, 2 bad command line.
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { pathToFileURL } from 'node:url'
import { parseArgs } from 'node:util'
import { defaultImportOptions, importSvg, SvgReadError, type ImportedDesign } from '../shared/geometry/importSvg.js'

const usage = 'usage: import-svg FILE.svg [--tolerance MM] [--min-speck MM2] [--json]'

/** A one-line failure: the reason on stderr, the exit code saying whose fault it is. */
export class CliFailure extends Error {
  constructor(
    message: string,
    readonly exitCode: 1 | 2,
  ) {
    super(message)
  }
}

/** A number option within the importer's accepted range (0 < tolerance ≤ 5 mm, speck area ≥ 0 mm²). */
function numberOption(name: string, text: string | undefined, fallback: number, accept: (value: number) => boolean, range: string): number {
  if (text === undefined) return fallback
  const value = Number(text)
  if (text.trim() === '' || !Number.isFinite(value) || !accept(value)) throw new CliFailure(`--${name} must be ${range}, got "${text}"`, 2)
  return value
}

export interface CliOptions {
  file: string
  toleranceMm: number
  minSpeckAreaMm2: number
  json: boolean
}

export function parseCommandLine(args: string[]): CliOptions {
  let parsed
  try {
    parsed = parseArgs({
      args,
      allowPositionals: true,
      options: {
        tolerance: { type: 'string' },
        'min-speck': { type: 'string' },
        json: { type: 'boolean', default: false },
        help: { type: 'boolean', short: 'h', default: false },
      },
    })
  } catch (error) {
    throw new CliFailure(`${(error as Error).message.split('\n')[0]} (${usage})`, 2)
  }
  const { values, positionals } = parsed
  if (values.help) throw new CliFailure(usage, 2)
  if (positionals.length !== 1) throw new CliFailure(positionals.length === 0 ? `no SVG file given (${usage})` : `give exactly one SVG file, got ${positionals.length} (${usage})`, 2)
  return {
    file: positionals[0]!,
    toleranceMm: numberOption('tolerance', values.tolerance, defaultImportOptions.toleranceMm, (value) => value > 0 && value <= 5, 'a number above 0 and at most 5 (mm)'),
    minSpeckAreaMm2: numberOption('min-speck', values['min-speck'], defaultImportOptions.minSpeckAreaMm2, (value) => value >= 0, 'a number of 0 or more (mm²)'),
    json: values.json,
  }
}

/** The report printed with --json: document size, totals, per-piece figures and outline, cut line count, warnings. */
export function toReport(design: ImportedDesign) {
  return {
    widthMm: design.widthMm,
    heightMm: design.heightMm,
    areaMm2: design.areaMm2,
    cutLengthMm: design.cutLengthMm,
    pieces: design.pieces.map((piece) => ({ areaMm2: piece.areaMm2, cutLengthMm: piece.cutLengthMm, holes: piece.holes.length, outline: piece.outline })),
    cutLines: design.cutLines.length,
    warnings: design.warnings,
  }
}

/** Indented JSON with each [x, y] point on one line, so long outlines stay readable. */
export function formatJson(value: unknown): string {
  return JSON.stringify(value, null, 2).replace(/\[\s+(-?[\d.eE+-]+),\s+(-?[\d.eE+-]+)\s+\]/g, '[$1, $2]')
}

const round = (value: number, digits = 1) => value.toFixed(digits)

export function humanSummary(file: string, design: ImportedDesign): string {
  const lines = [
    `${file}: ${round(design.widthMm)} × ${round(design.heightMm)} mm`,
    `  ${design.pieces.length} piece${design.pieces.length === 1 ? '' : 's'}, ${design.holeCount} hole${design.holeCount === 1 ? '' : 's'}, ${design.cutLines.length} cut line${design.cutLines.length === 1 ? '' : 's'}`,
    `  area ${round(design.areaMm2)} mm², cut length ${round(design.cutLengthMm)} mm (tolerance ${design.toleranceMm} mm)`,
  ]
  for (const warning of design.warnings) lines.push(`  warning ${warning.code} ×${warning.count}: ${warning.message}`)
  return lines.join('\n')
}

function readSvgFile(file: string): string {
  let bytes: Buffer
  try {
    bytes = readFileSync(file)
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code
    if (code === 'ENOENT') throw new CliFailure(`${file}: no such file`, 1)
    if (code === 'EISDIR') throw new CliFailure(`${file}: is a directory, not an SVG file`, 1)
    throw new CliFailure(`${file}: cannot be read (${code ?? (error as Error).message})`, 1)
  }
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes)
  } catch {
    throw new CliFailure(`${file}: not SVG text (not UTF-8)`, 1)
  }
}

export function run(args: string[]): { stdout: string } {
  const options = parseCommandLine(args)
  const text = readSvgFile(options.file)
  let design: ImportedDesign
  try {
    design = importSvg(text, { toleranceMm: options.toleranceMm, minSpeckAreaMm2: options.minSpeckAreaMm2 })
  } catch (error) {
    if (error instanceof SvgReadError) throw new CliFailure(`${options.file}: ${error.message} [${error.code}]`, 1)
    throw error
  }
  return { stdout: options.json ? formatJson(toReport(design)) : humanSummary(options.file, design) }
}

const isMain = process.argv[1] !== undefined && import.meta.url === pathToFileURL(resolve(process.argv[1])).href
if (isMain) {
  try {
    process.stdout.write(`${run(process.argv.slice(2)).stdout}\n`)
  } catch (error) {
    if (error instanceof CliFailure) {
      process.stderr.write(`import-svg: ${error.message}\n`)
      process.exitCode = error.exitCode
    } else {
      process.stderr.write(`import-svg: unexpected failure: ${(error as Error).message.split('\n')[0]}\n`)
      process.exitCode = 1
    }
  }
}
