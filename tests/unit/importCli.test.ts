import { spawnSync } from 'node:child_process'
import { writeFileSync, mkdtempSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { CliFailure, run } from '../../scripts/import-svg.js'

const root = fileURLToPath(new URL('../../', import.meta.url))
const fixture = (name: string) => path.join(root, 'fixtures/designs', name)

/** The failure `run` throws for these arguments (fails the test when it does not throw). */
function failureOf(args: string[]): CliFailure {
  try {
    run(args)
  } catch (error) {
    if (error instanceof CliFailure) return error
    throw error
  }
  throw new Error(`run(${args.join(' ')}) did not fail`)
}

describe('import-svg command', () => {
  it('reports the demo coaster as JSON: one disc with 31 holes', () => {
    const report = JSON.parse(run([fixture('felt-coaster.svg'), '--json']).stdout)
    // Drawn in 96 user units on a 4 in page: 1 unit = 4 px = 4 · 25.4 / 96 mm (W3C CSS Values and Units Level 3, §5.2).
    const mmPerUnit = (4 * 25.4) / 96
    // A disc of radius 47 less 1 hole of radius 4, 6 of 3, 12 of 2.5 and 12 of 1.5: πr², elementary geometry.
    const expectedAreaMm2 = Math.PI * (47 ** 2 - (4 ** 2 + 6 * 3 ** 2 + 12 * 2.5 ** 2 + 12 * 1.5 ** 2)) * mmPerUnit ** 2
    expect(report.widthMm).toBeCloseTo(101.6, 9)
    expect(Math.abs(report.areaMm2 - expectedAreaMm2) / expectedAreaMm2).toBeLessThan(1e-6)
    expect(report.pieces).toHaveLength(1)
    expect(report.pieces[0]).toMatchObject({ holes: 31 })
    expect(report.pieces[0].outline[0]).toHaveLength(2)
    expect(report).toMatchObject({ cutLines: 0, warnings: [] })
  })

  it('counts the fold of the gift tag as a cut line and applies the options', () => {
    const report = JSON.parse(run([fixture('gift-tag.svg'), '--tolerance', '0.1', '--min-speck', '2', '--json']).stdout)
    expect(report.cutLines).toBe(1)
    // The fold is drawn from y = 8 to y = 92 in half-millimetre user units: 42 mm.
    expect(report.cutLengthMm - report.pieces[0].cutLengthMm).toBeCloseTo(42, 9)
  })

  it('prints a short summary without --json', () => {
    const { stdout } = run([fixture('keyring-fob.svg')])
    expect(stdout).toContain('31.8 × 88.9 mm')
    expect(stdout).toContain('1 piece, 1 hole, 0 cut lines')
  })

  it('fails with exit code 2 and one line on a bad command line', () => {
    for (const args of [[], ['a.svg', 'b.svg'], [fixture('tack-badge.svg'), '--tolerance', 'abc'], [fixture('tack-badge.svg'), '--tolerance', '0'], [fixture('tack-badge.svg'), '--bogus']]) {
      const failure = failureOf(args)
      expect(failure.exitCode).toBe(2)
      expect(failure.message).not.toContain('\n')
    }
    expect(failureOf([fixture('tack-badge.svg'), '--min-speck=-1']).message).toMatch(/--min-speck must be a number of 0 or more/)
  })

  it('fails with exit code 1 on a file that is missing, not SVG or not usable', () => {
    const directory = mkdtempSync(path.join(tmpdir(), 'import-svg-'))
    const write = (name: string, content: string | Buffer) => {
      writeFileSync(path.join(directory, name), content)
      return path.join(directory, name)
    }
    const cases: [string, RegExp][] = [
      [path.join(directory, 'missing.svg'), /no such file/],
      [write('pixels.svg', Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])), /not SVG text/],
      [write('notes.svg', 'cut list'), /not well-formed XML/],
      [write('blank.svg', '<svg xmlns="http://www.w3.org/2000/svg"/>'), /no outlines to cut \[empty\]/],
      [write('flat.svg', '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 0 0"><rect width="1" height="1"/></svg>'), /\[bad_size\]/],
    ]
    for (const [file, message] of cases) {
      const failure = failureOf([file])
      expect(failure.exitCode).toBe(1)
      expect(failure.message).toMatch(message)
    }
  })

  it('exits non-zero with the reason on one stderr line when run as a program', () => {
    const result = spawnSync(process.execPath, ['--import', 'tsx', path.join(root, 'scripts/import-svg.ts'), 'no-such-design.svg'], { cwd: root, encoding: 'utf8' })
    expect(result.status).toBe(1)
    expect(result.stdout).toBe('')
    expect(result.stderr.trim().split('\n')).toEqual(['import-svg: no-such-design.svg: no such file'])
  })
})
