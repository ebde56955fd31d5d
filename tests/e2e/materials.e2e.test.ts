import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { addMember, baseUrl, signUp, testPassword } from '../api/helpers.js'
import { solidPng } from '../api/imageFixtures.js'
import { artifactsDir, launchBrowser, settleForScreenshot, signInThroughForm } from './browser.js'


const cardstock = 'Cardstock, 80 lb cover'

describe('materials, test cuts and stock in the browser', () => {
  let makerEmail: string
  let context: BrowserContext
  let close: () => Promise<void>
  let page: Page
  const consoleErrors: string[] = []

  beforeAll(async () => {
    const owner = await signUp('materials-e2e')
    makerEmail = (await addMember(owner, 'maker', 'materials-maker')).email
    ;({ context, close } = await launchBrowser())
    page = await context.newPage()
    page.on('console', (message) => {
      if (message.type() === 'error') consoleErrors.push(message.text())
    })
  })

  afterAll(async () => {
    await close?.()
  })

  it('a maker stars a material, logs a cut that did not go through, applies the suggestion and sees the new force and history', async () => {
    await signInThroughForm(page, baseUrl, makerEmail, testPassword)
    await page.getByTestId('nav-materials').click()
    await page.waitForURL(/\/materials$/)
    const items = page.getByTestId('material-item')
    await expect.poll(() => items.count()).toBeGreaterThan(10)

    // Star the cardstock: it moves to the top of the list.
    const item = page.locator(`[data-testid="material-item"][data-material-name="${cardstock}"]`)
    await item.getByTestId('material-star').click()
    await expect.poll(() => items.first().getAttribute('data-material-name')).toBe(cardstock)
    expect(await items.first().getAttribute('data-favourite')).toBe('true')
    await settleForScreenshot(page)
    await page.screenshot({ path: path.join(artifactsDir, 'materials.png'), fullPage: true })

    // Its page: grammage from the basis-weight definition (80 lb cover ≈ 216 g/m², ../shared/REFERENCES.md), the
    // catalogue's starting point, force 185.
    await items.first().getByTestId('material-link').click()
    await page.waitForURL(/\/materials\/[0-9a-f-]{36}$/)
    const bladeCard = page.getByTestId('recipe-card-blade')
    await bladeCard.waitFor()
    expect(await page.getByTestId('material-weight').textContent()).toBe('216 g/m² (80 lb cover)')
    expect(await bladeCard.getByTestId('recipe-starting-point').textContent()).toContain('Starting point — run a test cut')
    expect((await bladeCard.getByTestId('recipe-force-value').textContent())?.trim()).toBe('185')
    expect(await bladeCard.getByTestId('safety-blade').textContent()).toContain('Blades are sharp')
    // Cardstock may be lasered: its laser recipe carries the laser caution.
    expect(await page.getByTestId('recipe-card-laser').getByTestId('safety-laser').textContent()).toContain('never leave a running laser unattended')
    expect(await page.getByTestId('test-cuts-empty').count()).toBe(1)

    // Log a test cut that did not go through, with a photo.
    await page.getByTestId('test-cut-log').click()
    const dialog = page.getByTestId('test-cut-dialog')
    await dialog.waitFor()
    await page.getByTestId('test-cut-outcome-not_through').click()
    await page.getByTestId('test-cut-note').fill('Star points still attached')
    await dialog
      .locator('input[type="file"]')
      .setInputFiles({ name: 'star-test.png', mimeType: 'image/png', buffer: solidPng(160, 120, [196, 160, 110]) })
    await dialog.screenshot({ path: path.join(artifactsDir, 'test-cut-dialog.png') })
    await page.getByTestId('test-cut-save').click()
    await dialog.waitFor({ state: 'detached' })

    // The timeline shows it with its photo and the suggestion: one force step of 15 (common practice).
    const entry = page.getByTestId('test-cut-entry').first()
    await entry.waitFor()
    expect(await entry.getAttribute('data-outcome')).toBe('not_through')
    expect(await entry.getByTestId('test-cut-suggestion').textContent()).toContain('185 → 200')
    await entry.getByTestId('test-cut-photo-thumb').waitFor()
    await expect.poll(() => entry.locator('img').evaluate((image: HTMLImageElement) => image.naturalWidth)).toBe(160)

    // Apply in one click: the recipe shows the new force, the history the change and why.
    await entry.getByTestId('test-cut-apply').click()
    await expect.poll(async () => (await bladeCard.getByTestId('recipe-force-value').textContent())?.trim()).toBe('200')
    await bladeCard.getByTestId('recipe-tuned').waitFor()
    await entry.getByTestId('test-cut-applied').waitFor()
    const historyEntry = page.getByTestId('recipe-history-entry').first()
    expect(await historyEntry.getAttribute('data-field')).toBe('force')
    expect(await historyEntry.getByTestId('recipe-history-values').textContent()).toContain('185 → 200')
    expect(await historyEntry.textContent()).toContain('not through')
    expect(await historyEntry.textContent()).toContain('Test materials-maker')

    // A tuning step by hand: one more pass, with a reason.
    await bladeCard.getByTestId('recipe-passes-up').click()
    await bladeCard.getByTestId('recipe-reason').fill('Cleaner corners in two passes')
    await bladeCard.getByTestId('recipe-save').click()
    await expect.poll(() => page.getByTestId('recipe-history-entry').count()).toBe(2)
    expect(await page.getByTestId('recipe-history-entry').first().textContent()).toContain('Cleaner corners in two passes')
    // The first test cut was made with the old recipe: its suggestion is spent.
    expect(await page.getByTestId('test-cut-apply').count()).toBe(0)

    await settleForScreenshot(page)
    await page.screenshot({ path: path.join(artifactsDir, 'material-detail.png'), fullPage: true })
  })

  it('adds stock in a standard size, with the starred material first in the picker', async () => {
    await page.getByTestId('nav-stock').click()
    await page.waitForURL(/\/stock$/)
    await page.getByTestId('stock-empty').waitFor()
    await page.getByTestId('stock-add').click()
    const dialog = page.getByTestId('stock-dialog')
    await dialog.waitFor()

    // 12 × 12 in: common practice; 304.8 mm through 1 in = 25.4 mm.
    await dialog.locator('[data-size="sheet-12x12in"]').click()
    expect(await page.getByTestId('stock-width').inputValue()).toBe('304.8')
    await page.getByTestId('material-picker').click()
    const firstOption = page.locator('.q-menu .q-item').first()
    await firstOption.waitFor()
    expect(await firstOption.getAttribute('data-material-name')).toBe(cardstock)
    await firstOption.click()
    expect(await page.getByTestId('stock-name').inputValue()).toBe(`${cardstock}, 12 × 12 in sheet`)
    await page.getByTestId('stock-quantity').fill('40')
    await page.getByTestId('stock-price').fill('0.45')
    await dialog.screenshot({ path: path.join(artifactsDir, 'stock-dialog.png') })
    await page.getByTestId('stock-save').click()
    await dialog.waitFor({ state: 'detached' })

    const row = page.getByTestId('stock-row').first()
    await row.waitFor()
    expect(await row.getByTestId('stock-size').textContent()).toContain('304.8 × 304.8 mm')
    expect(await row.getByTestId('stock-on-hand').textContent()).toBe('40 sheets')

    // A negative width is refused under its input, before anything is sent.
    await page.getByTestId('stock-add').click()
    await page.getByTestId('stock-width').fill('-210')
    await page.getByTestId('stock-save').click()
    await page.getByTestId('stock-dialog').getByText('Sheet width must be above 0').waitFor()
    await page.keyboard.press('Escape')
    await page.getByTestId('stock-dialog').waitFor({ state: 'detached' })

    await settleForScreenshot(page)
    await page.screenshot({ path: path.join(artifactsDir, 'stock.png'), fullPage: true })
    expect(consoleErrors).toEqual([])
  })
})
