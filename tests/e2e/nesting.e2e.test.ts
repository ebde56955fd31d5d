import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { uploadDesignsResponseSchema } from '../../shared/schemas/designs.js'
import { addMember, api, baseUrl, bearer, signUp, testPassword, type SignedUpUser } from '../api/helpers.js'
import { artifactsDir, launchBrowser, settleForScreenshot, signInThroughForm } from './browser.js'

/**
 * A 40 mm × 25 mm label with 4 mm corner radii, one piece, in a 50 × 35 mm document. Its area is
 * 40 × 25 − (4 − π) × 4² ≈ 986.27 mm² (a rectangle less the four corners a quarter circle leaves out);
 * the test takes the exact figure from the upload's answer.
 */
const labelSvg = `<?xml version="1.0" encoding="UTF-8"?>
<svg xmlns="http://www.w3.org/2000/svg" width="50mm" height="35mm" viewBox="0 0 50 35">
  <rect x="5" y="5" width="40" height="25" rx="4" ry="4"/>
</svg>`

/** ISO 216: an A4 sheet is 210 mm × 297 mm. */
const A4_AREA_MM2 = 210 * 297


/** "18.9 %" → 18.9 */
function percentFrom(text: string | null): number {
  const match = /(-?\d+(?:\.\d+)?)\s*%/.exec(text ?? '')
  if (!match) throw new Error(`no percentage in “${text}”`)
  return Number(match[1])
}

describe('nest run in the browser', () => {
  let owner: SignedUpUser
  let designAreaMm2: number
  let context: BrowserContext
  let close: () => Promise<void>
  let page: Page
  const consoleErrors: string[] = []

  beforeAll(async () => {
    owner = await signUp('nesting')
    const uploaded = await api()
      .post(`/api/workspaces/${owner.workspace.id}/designs`)
      .set(bearer(owner.accessToken))
      .attach('files', Buffer.from(labelSvg, 'utf8'), { filename: 'label-40x25.svg', contentType: 'image/svg+xml' })
    if (uploaded.status !== 201) throw new Error(`upload failed: ${uploaded.status} ${JSON.stringify(uploaded.body)}`)
    const answer = uploadDesignsResponseSchema.parse(uploaded.body)
    expect(answer.designs).toHaveLength(1)
    expect(answer.designs[0]!.pieceCount).toBe(1)
    designAreaMm2 = answer.designs[0]!.areaMm2
    // Elementary geometry, as above: the reader's area must be that of the drawn rounded rectangle.
    expect(designAreaMm2).toBeCloseTo(1000 - (4 - Math.PI) * 16, 0)
    ;({ context, close } = await launchBrowser())
    page = await context.newPage()
    page.on('console', (message) => {
      if (message.type() === 'error') consoleErrors.push(message.text())
    })
  })

  afterAll(async () => {
    await close?.()
  })

  it('nests 12 copies of a label onto one A4 sheet, follows the progress and draws the checked layout', async () => {
    // Arrange: sign in through the form and open Nest run from the navigation.
    await signInThroughForm(page, baseUrl, owner.email, owner.password)
    await page.getByTestId('nav-nest').click()
    await page.waitForURL(/\/w\/[^/]+\/nest$/)
    await page.getByTestId('nest-outcome-empty').waitFor()
    await page.getByTestId('nest-recent-empty').waitFor()

    // Act: pick the design from the library search, 12 copies, an A4 sheet, 3 seconds of search.
    await page.getByTestId('nest-design-search').fill('label')
    const option = page.locator('[data-testid="nest-design-option"][data-design-name="label-40x25"]')
    await option.click()
    const row = page.getByTestId('nest-item-row')
    await expect.poll(() => row.count()).toBe(1)
    expect(await row.getAttribute('data-design-name')).toBe('label-40x25')
    await row.getByTestId('nest-item-quantity').fill('12')
    await page.getByTestId('nest-stock-kind').getByRole('button', { name: 'Sheets' }).click()
    await page.getByTestId('nest-stock-preset').locator('[data-preset="a4"]').click()
    expect(await page.getByTestId('nest-stock-width').inputValue()).toBe('210')
    expect(await page.getByTestId('nest-stock-height').inputValue()).toBe('297')
    await page.getByTestId('nest-time-budget').fill('3')
    await page.getByTestId('nest-start').click()

    // Assert: the run is followed live, then its layout is drawn and measured.
    const progress = page.getByTestId('nest-progress')
    await progress.waitFor()
    await page.waitForURL(/\/nest\?run=[0-9a-f-]{36}$/)
    expect(await progress.textContent()).toContain('Best utilisation so far')
    expect(await page.getByTestId('nest-cancel').isVisible()).toBe(true)
    // Queued first, then searching: wait until the search reports pieces placed.
    await page.getByTestId('nest-progress-placed').filter({ hasText: /^\s*[1-9]\d* of 12\s*$/ }).waitFor()
    expect(await page.getByTestId('nest-run-status').textContent()).toContain('Searching')
    // Followed through the event stream, not the polling fallback.
    expect(await progress.getAttribute('data-connection')).toBe('stream')
    await settleForScreenshot(page)
    await page.screenshot({ path: path.join(artifactsDir, 'nest-progress.png'), fullPage: true })

    await page.getByTestId('nest-result').waitFor({ timeout: 30_000 })
    expect(await page.getByTestId('nest-run-status').textContent()).toContain('Done')
    expect(await page.getByTestId('nest-sheet').count()).toBe(1)
    expect(await page.getByTestId('nest-piece').count()).toBe(12)
    expect((await page.getByTestId('nest-placed').textContent())?.trim()).toBe('12 of 12')
    expect((await page.getByTestId('nest-stock-used').textContent())?.trim()).toBe('1 sheet')
    expect(await page.getByTestId('nest-checked').textContent()).toContain('Checked: no overlaps, all inside the stock')

    const expectedPercent = ((12 * designAreaMm2) / A4_AREA_MM2) * 100
    const shownPercent = percentFrom(await page.getByTestId('nest-utilisation').textContent())
    expect(Math.abs(shownPercent - expectedPercent)).toBeLessThanOrEqual(0.1)
    // One sheet: its own figure is the total.
    expect(percentFrom(await page.getByTestId('nest-sheet-utilisation').textContent())).toBe(shownPercent)

    // The run heads the recent list, marked done, with the same utilisation.
    const recentRow = page.getByTestId('nest-recent-run')
    await expect.poll(() => recentRow.count()).toBe(1)
    await expect.poll(() => recentRow.first().getAttribute('data-status')).toBe('succeeded')
    expect(percentFrom(await recentRow.first().textContent())).toBe(shownPercent)

    await settleForScreenshot(page)
    await page.screenshot({ path: path.join(artifactsDir, 'nest-result.png'), fullPage: true })

    // The address keeps the run: a reload shows the same layout again.
    await page.reload()
    await page.getByTestId('nest-result').waitFor()
    expect(percentFrom(await page.getByTestId('nest-utilisation').textContent())).toBe(shownPercent)
    expect(await page.getByTestId('nest-sheet').count()).toBe(1)

    expect(consoleErrors).toEqual([])
  }, 90_000)

  it('stops a long run early and keeps its best layout, asking every second when the event stream is blocked', async () => {
    // Arrange: the same run again from the shown one's settings, with a minute of search; the event stream fails.
    await page.route('**/nest-runs/*/events', (route) => route.abort())
    await page.getByTestId('nest-reuse').click()
    await expect.poll(() => page.getByTestId('nest-item-row').count()).toBe(1)
    expect(await page.getByTestId('nest-item-quantity').inputValue()).toBe('12')
    await page.getByTestId('nest-time-budget').fill('60')

    // Act: start, wait until the search has placed everything once, then stop it.
    await page.getByTestId('nest-start').click()
    await page.getByTestId('nest-progress-placed').filter({ hasText: '12 of 12' }).waitFor()
    expect(await page.getByTestId('nest-progress').getAttribute('data-connection')).toBe('polling')
    await page.getByTestId('nest-cancel').click()

    // Assert: well before the minute is up, the best layout so far is shown with a note, and listed as stopped.
    await page.getByTestId('nest-result').waitFor({ timeout: 20_000 })
    expect(await page.getByTestId('nest-run-status').textContent()).toContain('Stopped early')
    await page.getByTestId('nest-stopped-note').waitFor()
    expect((await page.getByTestId('nest-placed').textContent())?.trim()).toBe('12 of 12')
    const rows = page.getByTestId('nest-recent-run')
    await expect.poll(() => rows.count()).toBe(2)
    await expect.poll(() => rows.first().getAttribute('data-status')).toBe('cancelled')
    await page.unroute('**/nest-runs/*/events')
    // The blocked stream is a failed request in the console; nothing else may be.
    expect(consoleErrors.filter((text) => !text.includes('net::ERR_FAILED'))).toEqual([])
    consoleErrors.splice(0)
  }, 60_000)

  it('lets a viewer open a run by its address but not start or stop one', async () => {
    // Arrange: a viewer of the same workspace, signed in on a clean browser session.
    const viewer = await addMember(owner, 'viewer', 'nest-viewer')
    const runs = await api().get(`/api/workspaces/${owner.workspace.id}/nest-runs`).set(bearer(owner.accessToken))
    const finished = (runs.body as { id: string; status: string }[]).find((run) => run.status === 'succeeded')!
    await context.clearCookies()
    await page.goto(`${baseUrl}/signin`)
    await page.getByTestId('signin-email').fill(viewer.email)
    await page.getByTestId('signin-password').fill(testPassword)
    await page.getByTestId('signin-submit').click()
    await page.waitForURL(/\/w\/[^/]+$/)

    // Act: open the shared address of the finished run.
    await page.goto(`${baseUrl}/w/${owner.workspace.id}/nest?run=${finished.id}`)

    // Assert: the layout and the list are there; the controls that change anything are not.
    await page.getByTestId('nest-result').waitFor()
    expect(await page.getByTestId('nest-sheet').count()).toBe(1)
    await expect.poll(() => page.getByTestId('nest-recent-run').count()).toBe(2)
    expect(await page.getByTestId('nest-start').count()).toBe(0)
    expect(await page.getByTestId('nest-design-search').count()).toBe(0)
    expect(await page.getByTestId('nest-reuse').count()).toBe(0)
    expect(consoleErrors).toEqual([])
  }, 60_000)
})
