import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { addMember, baseUrl, signUp, testPassword } from '../api/helpers.js'
import { artifactsDir, launchBrowser, settleForScreenshot, signInThroughForm } from './browser.js'


/** YYYY-MM-DD of a day some days back, in the browser's (and this process's) time zone. */
function dayAgo(days: number): string {
  const date = new Date(Date.now() - days * 24 * 3600 * 1000)
  const pad = (value: number) => String(value).padStart(2, '0')
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}`
}

describe('cutters, blades and care in the browser', () => {
  let makerEmail: string
  let context: BrowserContext
  let close: () => Promise<void>
  let page: Page
  const consoleErrors: string[] = []

  beforeAll(async () => {
    const owner = await signUp('cutters-e2e')
    makerEmail = (await addMember(owner, 'maker', 'cutters-e2e-maker')).email
    ;({ context, close } = await launchBrowser())
    page = await context.newPage()
    page.on('console', (message) => {
      if (message.type() === 'error') consoleErrors.push(message.text())
    })
  })

  afterAll(async () => {
    await close?.()
  })

  it('a maker adds a cutter, fits a blade past the caution, logs care and sees the reminder', { timeout: 90_000 }, async () => {
    try {
      await walkThrough()
    } catch (error) {
      await page.screenshot({ path: path.join(artifactsDir, 'cutters-failure.png'), fullPage: true }).catch(() => {})
      throw error
    }
    expect(consoleErrors).toEqual([])
  })

  async function walkThrough(): Promise<void> {
    await signInThroughForm(page, baseUrl, makerEmail, testPassword)
    await page.getByTestId('nav-cutters').click()
    await page.waitForURL(/\/cutters$/)
    await page.getByTestId('cutters-empty').waitFor()

    // Add a cutter: the maker's unit is mm (the sign-up default).
    await page.getByTestId('cutters-add').first().click()
    const dialog = page.getByTestId('cutter-dialog')
    await dialog.getByTestId('cutter-name').fill('Bench cutter A')
    await dialog.getByTestId('cutter-width').fill('330')
    await dialog.getByTestId('cutter-length').fill('3000')
    await dialog.getByTestId('cutter-force-max').fill('500')
    await dialog.getByTestId('cutter-save').click()
    await dialog.waitFor({ state: 'detached' })
    const card = page.getByTestId('cutter-card-Bench cutter A')
    await card.waitFor()
    expect(await card.textContent()).toContain('No blade recorded yet')

    // Its page; fit a blade: the dialog shows the blade-handling caution first, then the test-cut hint.
    await card.getByTestId('cutter-link').click()
    await page.waitForURL(/\/cutters\/[0-9a-f-]{36}$/)
    await page.getByTestId('cutter-fit-blade').click()
    const fit = page.getByTestId('fit-blade-dialog')
    const caution = fit.getByTestId('cutter-safety-blade')
    await caution.waitFor()
    expect(await caution.textContent()).toMatch(/Keep the cap on.*hold the housing rather\s+than the blade.*follow your machine's manual/s)
    await fit.getByTestId('fit-blade-save').click()
    const hint = fit.getByTestId('fit-blade-test-cut-hint')
    await hint.waitFor()
    expect(await hint.textContent()).toMatch(/first job of each material on this cutter will ask for a test cut/)
    await fit.getByTestId('fit-blade-close').click()
    await fit.waitFor({ state: 'detached' })
    await page.getByTestId('cutter-blade-card').getByTestId('cutter-wear-badge').waitFor()
    expect(await page.getByTestId('cutter-blade-card').getByTestId('cutter-wear-badge').getAttribute('data-level')).toBe('ok')
    // The fit wrote a blade swap into the care log.
    await expect.poll(() => page.getByTestId('care-entry-kind').allTextContents()).toEqual(['Blade swapped'])

    // Remind of a roller check every 7 days.
    await page.getByTestId('reminders-edit').click()
    await page.getByTestId('reminder-on-roller_checked').click()
    await page.getByTestId('reminder-days-roller_checked').fill('7')
    await page.getByTestId('reminders-save').click()
    await page.getByTestId('reminder-roller_checked').waitFor()

    // Log a roller check done ten days ago: the reminder is overdue.
    await page.getByTestId('cutter-log-care').click()
    const care = page.getByTestId('care-dialog')
    await care.getByTestId('care-kind-roller_checked').click()
    await care.locator('input[type="date"]').fill(dayAgo(10))
    await care.getByTestId('care-note').fill('Left roller back on its mark')
    await care.getByTestId('care-save').click()
    await care.waitFor({ state: 'detached' })
    await expect.poll(() => page.getByTestId('care-entry-kind').allTextContents()).toEqual(['Blade swapped', 'Pinch rollers checked'])
    await expect.poll(() => page.getByTestId('reminder-roller_checked').textContent()).toMatch(/Overdue: was due 3 days ago/)

    await settleForScreenshot(page)
    await page.screenshot({ path: path.join(artifactsDir, 'cutters.png'), fullPage: true })

    // The list shows the overdue care; the checklist is one click away and logs care on the chosen cutter.
    await page.getByTestId('cutter-back').click()
    await page.getByTestId('cutter-care-overdue').waitFor()
    await page.getByTestId('cutters-checklist-link').click()
    await page.waitForURL(/\/cuts-not-through$/)
    await page.getByTestId('check-rollers').waitFor()
    expect(await page.getByTestId('checklist').locator('> li').count()).toBe(7)
    await page.getByTestId('check-action-spring_checked').click()
    const checklistCare = page.getByTestId('care-dialog')
    await checklistCare.getByTestId('care-save').click()
    await checklistCare.waitFor({ state: 'detached' })
    await settleForScreenshot(page)
    await page.screenshot({ path: path.join(artifactsDir, 'cuts-not-through.png'), fullPage: true })
  }
})
