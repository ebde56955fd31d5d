import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { api, baseUrl, bearer, signUp, type SignedUpUser } from '../api/helpers.js'
import { artifactsDir, launchBrowser, signInThroughForm } from './browser.js'

/** A 40 mm × 25 mm label, one piece, in a 50 × 35 mm document. */
const labelSvg = `<?xml version="1.0" encoding="UTF-8"?>
<svg xmlns="http://www.w3.org/2000/svg" width="50mm" height="35mm" viewBox="0 0 50 35">
  <rect x="5" y="5" width="40" height="25" rx="4" ry="4"/>
</svg>`

describe('stock comparison in the browser', () => {
  let owner: SignedUpUser
  let context: BrowserContext
  let close: () => Promise<void>
  let page: Page
  const consoleErrors: string[] = []

  beforeAll(async () => {
    owner = await signUp('comparing')
    const uploaded = await api()
      .post(`/api/workspaces/${owner.workspace.id}/designs`)
      .set(bearer(owner.accessToken))
      .attach('files', Buffer.from(labelSvg, 'utf8'), { filename: 'label-40x25.svg', contentType: 'image/svg+xml' })
    if (uploaded.status !== 201) throw new Error(`upload failed: ${uploaded.status} ${JSON.stringify(uploaded.body)}`)
    // ISO 216: A4 = 210 × 297 mm.
    await api()
      .post(`/api/workspaces/${owner.workspace.id}/stock`)
      .set(bearer(owner.accessToken))
      .send({ kind: 'sheet', name: 'Cardstock A4', widthMm: 210, heightMm: 297, price: 0.4 })
      .expect(201)
    ;({ context, close } = await launchBrowser())
    page = await context.newPage()
    page.on('console', (message) => {
      if (message.type() === 'error') consoleErrors.push(message.text())
    })
  })

  afterAll(async () => {
    await close?.()
  })

  it('compares three stocks and shows the table with the best marked and the chart', async () => {
    await signInThroughForm(page, baseUrl, owner.email, owner.password)
    await page.getByTestId('nav-comparisons').click()
    await page.waitForURL(/\/w\/[^/]+\/comparisons$/)
    await page.getByText('No comparisons yet').waitFor()
    await page.getByTestId('comparison-new').click()
    await page.waitForURL(/\/comparisons\/new$/)

    // Twenty labels, the A4 cardstock from the shelf, and two stocks typed in.
    await page.getByTestId('nest-design-search').fill('label')
    await page.locator('[data-testid="nest-design-option"][data-design-name="label-40x25"]').click()
    await page.getByTestId('nest-item-row').getByTestId('nest-item-quantity').fill('20')
    await page.getByTestId('comparison-shelf-Cardstock A4').click()
    await page.getByTestId('comparison-inline-label').fill('Vinyl roll 305')
    await page.getByRole('button', { name: 'Roll' }).click()
    await page.getByTestId('comparison-inline-width').fill('305')
    await page.getByTestId('comparison-inline-price').fill('2.50')
    await page.getByTestId('comparison-inline-add').click()
    await page.getByTestId('comparison-inline-label').fill('Square sheet 305')
    await page.getByRole('button', { name: 'Sheets' }).click()
    await page.getByTestId('comparison-inline-width').fill('305')
    await page.getByTestId('comparison-inline-height').fill('305')
    await page.getByTestId('comparison-inline-price').fill('0.75')
    await page.getByTestId('comparison-inline-add').click()
    expect(await page.getByTestId('comparison-stock-count').textContent()).toContain('3 of 2–8 stocks picked')
    await page.getByTestId('comparison-time-budget').fill('1')
    await page.getByTestId('comparison-start').click()

    // The detail page follows the three runs, then shows the table and the chart.
    await page.waitForURL(/\/comparisons\/[0-9a-f-]{36}$/)
    await page.getByTestId('comparison-progress').waitFor()
    await page.locator('[data-testid="comparison-status"][data-status="succeeded"]').waitFor({ timeout: 60_000 })
    const table = page.getByTestId('comparison-table')
    for (const label of ['Cardstock A4', 'Vinyl roll 305', 'Square sheet 305']) {
      await table.getByTestId(`comparison-row-${label}`).waitFor()
      expect(await table.getByTestId(`comparison-open-${label}`).isVisible()).toBe(true)
    }
    // 20 labels of 42 × 27 mm with spacing fit on one A4 sheet (4 across 200 mm, 10 rows down 287 mm): 0.40.
    expect(await table.getByTestId('comparison-row-Cardstock A4').textContent()).toContain('1 sheet')
    expect(await table.getByTestId('comparison-row-Cardstock A4').textContent()).toContain('0.40')
    // Utilisation, waste, cost, cost per piece and cut time each have a best (cut length is the same on every stock).
    expect(await table.locator('[aria-label="Best"]').count()).toBeGreaterThanOrEqual(4)
    expect(await table.getByTestId('comparison-row-Vinyl roll 305').textContent()).toMatch(/\d+ s/)
    const chart = page.getByTestId('comparison-chart')
    await chart.locator('canvas').waitFor()
    expect(await chart.getAttribute('aria-label')).toContain('Vinyl roll 305: waste')

    // Sorting by cost: the roll is cheapest (20 labels take about three 27 mm rows of the 305 mm roll, ~0.1 m × 2.50),
    // then the A4 sheet (0.40), then the 305 mm square sheet (0.75); a second click reverses.
    const firstLabel = async () => (await table.locator('tbody tr').first().locator('td').first().locator('div').first().textContent())?.trim()
    await table.locator('th', { hasText: 'Material cost' }).click()
    expect(await firstLabel()).toBe('Vinyl roll 305')
    await table.locator('th', { hasText: 'Material cost' }).click()
    expect(await firstLabel()).toBe('Square sheet 305')

    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur())
    await page.mouse.move(0, 0)
    await page.screenshot({ path: path.join(artifactsDir, 'comparison.png'), fullPage: true })

    // Any row opens as a layout in the editor.
    await table.getByTestId('comparison-open-Vinyl roll 305').click()
    await page.waitForURL(/\/layouts\/[0-9a-f-]{36}$/)
    expect(consoleErrors).toEqual([])
  }, 120_000)
})
