import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { chromium, type BrowserContext, type Page } from 'playwright-core'

/**
 * Debian's Chromium, headless, in a fresh throw-away profile, on about:blank. The flags keep it from calling out.
 * (tests/e2e/browser.ts also creates the e2e artifacts folder; the reference checks need none.)
 */
export async function openBlankPage(): Promise<{ page: Page; close: () => Promise<void> }> {
  const profileDir = mkdtempSync(path.join(tmpdir(), 'sheetsmith-reference-'))
  let context: BrowserContext
  try {
    context = await chromium.launchPersistentContext(profileDir, {
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      headless: true,
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
    })
  } catch (error) {
    rmSync(profileDir, { recursive: true, force: true })
    throw error
  }
  const page = context.pages()[0] ?? (await context.newPage())
  return {
    page,
    close: async () => {
      await context.close()
      rmSync(profileDir, { recursive: true, force: true })
    },
  }
}

/** The browser's own SVGGeometryElement.getTotalLength() for each path data string, in one round trip (W3C SVG 2 §8). */
export async function browserPathLengths(page: Page, pathData: string[]): Promise<number[]> {
  return page.evaluate((list) => {
    const namespace = 'http://www.w3.org/2000/svg'
    const svg = document.createElementNS(namespace, 'svg')
    document.body.appendChild(svg)
    return list.map((d) => {
      const element = document.createElementNS(namespace, 'path')
      element.setAttribute('d', d)
      svg.appendChild(element)
      return element.getTotalLength()
    })
  }, pathData)
}
