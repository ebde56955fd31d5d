import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { contourLength } from '../../shared/geometry/curves.js'
import { parsePathData } from '../../shared/geometry/pathData.js'
import { browserPathLengths, openBlankPage } from './headlessChromium.js'
import { generatedPaths, handWrittenPaths } from './pathCorpus.js'

/** Sum of the lengths of a path's subpaths, along the true curves. */
const ourLength = (d: string) => parsePathData(d).contours.reduce((sum, contour) => sum + contourLength(contour), 0)

/**
 * Reference: the browser's own SVGGeometryElement.getTotalLength() (W3C SVG 2 §8, the user agent's path length),
 * in Debian's headless Chromium. Chromium measures flattened curves in single precision, so agreement within
 * 0.1 % is required, not equality. Paths whose browser length is below 1e-6 are degenerate: a relative difference
 * means nothing there, so they are left out of the relative check and only required to measure below 1e-6 for us too.
 */
const relativeTolerance = 1e-3
const degenerateLength = 1e-6

/** Paths our length and the browser's differ on by more than the tolerance, one readable line each. */
async function disagreementsWithBrowser(page: Page, corpus: string[]): Promise<{ compared: number; disagreements: string[] }> {
  const browserLengths = await browserPathLengths(page, corpus)
  const all = corpus.map((d, index) => ({ d, browser: browserLengths[index]!, ours: ourLength(d) }))
  const entries = all.filter((entry) => entry.browser >= degenerateLength)
  const disagreements = entries
    .map((entry) => ({ ...entry, relative: Math.abs(entry.ours - entry.browser) / entry.browser }))
    .filter((entry) => !(entry.relative <= relativeTolerance))
    .map(({ d, ours, browser, relative }) => `${JSON.stringify(d)}: ours ${ours}, Chromium ${browser} (relative difference ${relative.toExponential(2)})`)
  const degenerateDisagreements = all
    .filter((entry) => entry.browser < degenerateLength && !(entry.ours < degenerateLength))
    .map(({ d, ours, browser }) => `${JSON.stringify(d)}: ours ${ours}, Chromium ${browser} (degenerate in the browser only)`)
  return { compared: entries.length, disagreements: [...disagreements, ...degenerateDisagreements] }
}

describe('path length against headless Chromium’s getTotalLength()', () => {
  let page: Page
  let closeBrowser: (() => Promise<void>) | undefined

  beforeAll(async () => {
    const opened = await openBlankPage()
    page = opened.page
    closeBrowser = opened.close
  })

  afterAll(async () => {
    await closeBrowser?.()
  })

  it('agrees within 0.1 % on every path of a corpus of hand-written and 200 generated paths', async () => {
    const corpus = [...handWrittenPaths, ...generatedPaths(0x5ee7, 200)]
    const letters = new Set(corpus.join('').match(/[MLHVCSQTAZ]/gi))
    expect([...letters].sort().join(''), 'every command letter, both cases').toBe('ACHLMQSTVZachlmqstvz')

    const { compared, disagreements } = await disagreementsWithBrowser(page, corpus)

    expect(compared, 'non-degenerate paths compared').toBeGreaterThanOrEqual(200)
    expect(disagreements).toEqual([])
  })

  it('reads numbers written with leading zeros ("010", "05") as the browser does', async () => {
    // The path grammar allows leading zeros: an integer is any digit-sequence (W3C SVG 1.1 §8.3.9 "The grammar for
    // path data"). "L 010 0" is a line to (10, 0).
    const corpus = ['M0 0 L 010 0', 'M0 0 L10 0 L10 05', 'M0 0 h 007.5 v 02']

    const { compared, disagreements } = await disagreementsWithBrowser(page, corpus)

    expect(compared).toBe(corpus.length)
    expect(disagreements).toEqual([])
  })

  it('stops at a letter that is not an SVG path command ("R"), as the browser does', async () => {
    // R is not in the path grammar (SVG 1.1 §8.3.9); a path is rendered up to the command containing the first
    // error (SVG 1.1 Appendix F.2 "Error processing"). So only the first line, 10 long, is drawn.
    const corpus = ['M0 0 L10 0 R1 1 2 2 L10 10', 'M0 0 L10 0 r1 1 2 2 l0 10']

    const { compared, disagreements } = await disagreementsWithBrowser(page, corpus)

    expect(compared).toBe(corpus.length)
    expect(disagreements).toEqual([])
  })
})
