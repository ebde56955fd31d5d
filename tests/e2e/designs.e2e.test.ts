import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { baseUrl, signUp, type SignedUpUser } from '../api/helpers.js'
import { artifactsDir, launchBrowser, settleForScreenshot, signInThroughForm } from './browser.js'

/**
 * A 40 mm ring: outer circle r = 20 mm, hole r = 5 mm, one path filled even-odd, in a 50 mm document.
 * Expected values are elementary geometry: area π(20² − 5²) = 1178.097 mm², cut length 2π(20 + 5) = 157.080 mm.
 */
const ringSvg = `<?xml version="1.0" encoding="UTF-8"?>
<svg xmlns="http://www.w3.org/2000/svg" width="50mm" height="50mm" viewBox="0 0 50 50">
  <path fill-rule="evenodd" d="M45 25A20 20 0 1 0 5 25A20 20 0 1 0 45 25ZM30 25A5 5 0 1 0 20 25A5 5 0 1 0 30 25Z"/>
</svg>`

/** A rounded label with live text: the outline is a piece, the text is skipped with a warning. */
const labelWithTextSvg = `<svg xmlns="http://www.w3.org/2000/svg" width="80mm" height="30mm" viewBox="0 0 80 30">
  <rect x="2" y="2" width="76" height="26" rx="3"/>
  <text x="10" y="20" font-size="10">Fresh cut</text>
</svg>`

const svgFile = (name: string, text: string) => ({ name, mimeType: 'image/svg+xml', buffer: Buffer.from(text, 'utf8') })


describe('design library in the browser', () => {
  let owner: SignedUpUser
  let context: BrowserContext
  let close: () => Promise<void>
  let page: Page
  const consoleErrors: string[] = []

  beforeAll(async () => {
    owner = await signUp('designs')
    ;({ context, close } = await launchBrowser())
    page = await context.newPage()
    page.on('console', (message) => {
      if (message.type() === 'error') consoleErrors.push(message.text())
    })
  })

  afterAll(async () => {
    await close?.()
  })

  it('uploads two SVG files, reads the ring exactly, renames, tags and deletes it', async () => {
    // Arrange: sign in through the form and open the library from the navigation.
    await signInThroughForm(page, baseUrl, owner.email, owner.password)
    await page.getByTestId('nav-designs').click()
    await page.waitForURL(/\/w\/[^/]+\/designs$/)
    await page.getByTestId('design-library-empty').waitFor()

    // Act: upload both files through the file input behind "Choose SVG files".
    await page.getByTestId('design-file-input').setInputFiles([svgFile('ring-40mm.svg', ringSvg), svgFile('label-with-text.svg', labelWithTextSvg)])

    // Assert: both were added, shown as cards; the one with text carries a warning badge.
    const summary = page.getByTestId('design-upload-summary')
    await summary.waitFor()
    expect(await summary.textContent()).toContain('2 designs added')
    expect(await page.getByTestId('design-rejected').count()).toBe(0)
    await expect.poll(() => page.getByTestId('design-card').count()).toBe(2)
    await settleForScreenshot(page)
    await page.screenshot({ path: path.join(artifactsDir, 'design-upload.png'), fullPage: true })
    const ringCard = page.locator('[data-testid="design-card"][data-design-name="ring-40mm"]')
    const labelCard = page.locator('[data-testid="design-card"][data-design-name="label-with-text"]')
    expect(await ringCard.getByTestId('design-card-size').textContent()).toBe('40.0 × 40.0 mm')
    expect(await ringCard.getByTestId('design-warning-badge').count()).toBe(0)
    expect(await labelCard.getByTestId('design-warning-badge').count()).toBe(1)

    // The ring's page: one piece, its area and cut length, read cleanly.
    await ringCard.click()
    await page.waitForURL(/\/designs\/[0-9a-f-]{36}$/)
    await page.getByTestId('design-detail-drawing').waitFor()
    const pieceRows = page.getByTestId('design-piece-row')
    await expect.poll(() => pieceRows.count()).toBe(1)
    expect(await pieceRows.first().getByTestId('design-piece-area').textContent()).toBe('1178.1 mm²')
    expect(await pieceRows.first().getByTestId('design-piece-cut-length').textContent()).toBe('157.1 mm')
    expect(await page.getByTestId('design-total-holes').textContent()).toBe('1')
    expect(await page.getByTestId('design-warnings').textContent()).toContain('Read cleanly')

    // Pointing at the piece in the list highlights it in the drawing.
    await pieceRows.first().hover()
    await expect.poll(() => page.locator('[data-testid="design-drawing-piece"].design-drawing__piece--active').count()).toBe(1)

    // Rename inline.
    await page.getByTestId('design-name-edit').click()
    await page.getByTestId('design-name-input').fill('Washer ring 40 mm')
    await page.getByTestId('design-name-save').click()
    await expect.poll(() => page.getByTestId('page-title').textContent()).toBe('Washer ring 40 mm')

    // Add a tag.
    await page.getByTestId('design-tag-input').fill('washers')
    await page.getByTestId('design-tag-input').press('Enter')
    await page.locator('[data-testid="design-tags"] [data-tag="washers"]').waitFor()

    // Let the pieces be placed one by one, and back.
    const keepTogether = page.getByTestId('design-keep-together')
    const hint = page.getByTestId('design-keep-together-hint')
    expect(await hint.textContent()).toContain('move as one group')
    await keepTogether.click()
    await expect.poll(() => hint.textContent()).toContain('placed on its own')
    await keepTogether.click()
    await expect.poll(() => hint.textContent()).toContain('move as one group')

    // The original downloads under its file name.
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('design-download').click()])
    expect(download.suggestedFilename()).toBe('ring-40mm.svg')

    await settleForScreenshot(page)
    await page.screenshot({ path: path.join(artifactsDir, 'design-detail.png'), fullPage: true })

    // Back in the library, the tag and the search each narrow the grid to the right card.
    await page.getByTestId('design-back').click()
    await page.waitForURL(/\/designs$/)
    await page.locator('[data-testid="design-tag-filter"] [data-tag="washers"]').click()
    // The names are polled, not the count: one card is also what the grid shows before a new filter's answer arrives.
    const cardNames = () => page.getByTestId('design-card').evaluateAll((cards) => cards.map((card) => card.getAttribute('data-design-name')))
    await page.waitForURL(/tag=washers/)
    await expect.poll(cardNames).toEqual(['Washer ring 40 mm'])
    await page.locator('[data-testid="design-tag-filter"] [data-tag="washers"]').click()
    await page.getByTestId('design-search').fill('label')
    await page.waitForURL(/search=label/)
    await expect.poll(cardNames).toEqual(['label-with-text'])
    await page.getByTestId('design-search').fill('')
    await expect.poll(() => page.getByTestId('design-card').count()).toBe(2)

    // Delete with confirmation: back in the library with one card left.
    await page.locator('[data-testid="design-card"][data-design-name="Washer ring 40 mm"]').click()
    await page.getByTestId('design-delete').click()
    const dialog = page.getByRole('dialog')
    expect(await dialog.textContent()).toContain('Washer ring 40 mm')
    await page.getByTestId('confirm-ok').click()
    await dialog.waitFor({ state: 'detached' })
    await page.waitForURL(/\/designs$/)
    await page.getByText('“Washer ring 40 mm” was deleted.').waitFor()
    await expect.poll(() => page.getByTestId('design-card').count()).toBe(1)
    expect(await page.getByTestId('design-card').first().getAttribute('data-design-name')).toBe('label-with-text')

    await settleForScreenshot(page)
    await page.screenshot({ path: path.join(artifactsDir, 'design-library.png'), fullPage: true })
    expect(consoleErrors).toEqual([])
  })
})
