import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { addMember, api, baseUrl, bearer, signUp, testPassword, type SignedUpUser } from '../api/helpers.js'
import { cornerLayout, createBladeCutter, createJob, createMaterial, createStock, fitBlade, uploadSquare, workspaceUrl } from '../api/jobsFixtures.js'
import { artifactsDir, launchBrowser, settleForScreenshot, signInThroughForm } from './browser.js'


// Worked example by hand: a 50 × 50 mm square cuts 200 mm per pass; 2 passes × 3 runs = 1 200 mm = 1.20 m of wear.
// The maker's unit is mm, so the page shows metres.

describe('jobs in the browser', () => {
  let owner: SignedUpUser
  let makerEmail: string
  let jobId: string
  let jobNumber: number
  let context: BrowserContext
  let close: () => Promise<void>
  let page: Page
  const consoleErrors: string[] = []

  beforeAll(async () => {
    owner = await signUp('jobs-e2e')
    makerEmail = (await addMember(owner, 'maker', 'jobs-e2e-maker')).email
    const squareId = await uploadSquare(owner)
    const layoutId = await cornerLayout(owner, squareId)
    const cardId = await createMaterial(owner, 'Linen card', 2)
    const stockId = await createStock(owner, { kind: 'sheet', name: 'Linen card 100 square', widthMm: 100, heightMm: 100, materialId: cardId, quantityOnHand: 12 })
    const cutterId = await createBladeCutter(owner, 'Studio bench cutter', [{ kind: 'housing_cleaned', intervalDays: 2 }])
    await fitBlade(owner, cutterId)
    const job = await createJob(owner, { title: 'Gift tags for the winter fair', layoutId, stockItemId: stockId, cutterId, quantity: 3, customerName: 'Juniper Row Market', dueDate: new Date(Date.now() + 2 * 86_400_000).toISOString().slice(0, 10) })
    jobId = job.id
    jobNumber = job.number
    await createJob(owner, { title: 'Spare tags', layoutId, stockItemId: stockId, dueDate: new Date(Date.now() + 5 * 86_400_000).toISOString().slice(0, 10) })
    ;({ context, close } = await launchBrowser())
    page = await context.newPage()
    page.on('console', (message) => {
      if (message.type() === 'error') consoleErrors.push(message.text())
    })
  })

  afterAll(async () => {
    await close?.()
  })

  it('a maker completes a job and sees the blade wear and the stock change', async () => {
    await signInThroughForm(page, baseUrl, makerEmail, testPassword)
    await page.getByTestId('nav-jobs').click()
    await page.waitForURL(/\/jobs$/)
    await expect.poll(() => page.getByTestId('job-item').count()).toBe(2)
    await page.getByTestId('jobs-view-due-soon').click()
    await expect.poll(() => page.getByTestId('jobs-due-soon-note').isVisible()).toBe(true)
    await page.locator(`[data-testid="job-item"][data-job-number="${jobNumber}"]`).click()
    await page.waitForURL(new RegExp(`/jobs/${jobId}$`))

    // A fresh blade: the job asks for a test cut of the material first, and links to its log.
    await expect.poll(() => page.getByTestId('job-test-cut-prompt').isVisible()).toBe(true)
    expect(await page.getByTestId('job-test-cut-link').getAttribute('href')).toMatch(/\/materials\/[0-9a-f-]{36}$/)
    expect(await page.getByTestId('job-stock-on-hand').textContent()).toContain('12 on hand')

    await page.getByTestId('job-start').click()
    await expect.poll(() => page.getByTestId('job-detail-status').textContent()).toContain('Cutting')
    await page.getByTestId('job-done').click()
    const dialog = page.getByTestId('job-done-dialog')
    await dialog.waitFor()
    expect(await page.getByTestId('job-done-stock').textContent()).toContain('3 sheets of “Linen card 100 square”: 12 on hand → 9')
    expect(await page.getByTestId('job-done-wear').textContent()).toContain('Adds 1.20 m of cut (2 passes × 3)')
    await page.getByTestId('job-done-remnant').click()
    await page.getByTestId('job-done-confirm').click()

    await expect.poll(() => page.getByTestId('job-detail-status').textContent()).toContain('Done')
    expect(await page.getByTestId('job-stock-on-hand').textContent()).toContain('9 on hand')
    expect(await page.getByTestId('job-blade-wear').textContent()).toMatch(/1\.20 m cut of 2000\.00 m/)
    expect(await page.getByTestId('job-remnant').textContent()).toContain(`Remnant of Job ${jobNumber}`)
    expect(await page.getByTestId('job-history').textContent()).toContain('Cutting → Done')

    // The API agrees: the stock and the blade moved.
    const stock = (await api().get(`${workspaceUrl(owner)}/stock?search=Linen`).set(bearer(owner.accessToken)).expect(200)).body
    expect(stock.items.find((item: { name: string }) => item.name === 'Linen card 100 square').quantityOnHand).toBe(9)

    // The stock page shows the remnant with its badge.
    await page.getByTestId('nav-stock').click()
    await page.waitForURL(/\/stock$/)
    await expect.poll(() => page.getByTestId('stock-remnant-badge').count()).toBe(1)

    // The dashboard: the other job due soon, the blade's wear, care due and the month's material.
    await page.getByTestId('nav-home').click()
    await page.getByTestId('dashboard').waitFor()
    await expect.poll(() => page.getByTestId('dashboard-due').getByTestId('job-item').count()).toBe(1)
    expect(await page.getByTestId('dashboard-blade').textContent()).toContain('Studio bench cutter')
    expect(await page.getByTestId('dashboard-care').textContent()).toContain('Clean the blade housing')
    await page.getByTestId('dashboard-material-chart').waitFor()
    await page.waitForTimeout(300)
    await settleForScreenshot(page)
    await page.screenshot({ path: path.join(artifactsDir, 'dashboard.png'), fullPage: true })
    expect(consoleErrors).toEqual([])
  })
})
