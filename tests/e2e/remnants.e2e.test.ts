import path from 'node:path'
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { jobSchema } from '../../shared/schemas/jobs.js'
import { api, baseUrl, bearer, signUp, testPassword, type SignedUpUser } from '../api/helpers.js'
import { completeJob, cornerLayout, createJob, createStock, uploadSquare, workspaceUrl } from '../api/jobsFixtures.js'
import { artifactsDir, launchBrowser, signInThroughForm } from './browser.js'

// Worked example by hand: a 50 × 50 square cut from the corner of a 100 × 100 sheet (margin and spacing 0) leaves an
// L of 10 000 − 2 500 = 7 500 mm² = 75.0 cm². Three 20 × 20 squares (3 × 400 = 1 200 mm²) on it: 1 200 / 7 500 = 16.0 %.

describe('remnants in the layout editor', () => {
  let owner: SignedUpUser
  let remnantName: string
  let tagsLayoutId: string
  let context: BrowserContext
  let close: () => Promise<void>
  let page: Page
  const consoleErrors: string[] = []

  beforeAll(async () => {
    owner = await signUp('remnants-e2e')
    const squareId = await uploadSquare(owner, 50)
    const smallId = await uploadSquare(owner, 20)
    const layoutId = await cornerLayout(owner, squareId)
    const stockId = await createStock(owner, { kind: 'sheet', name: 'Kraft card 100 square', widthMm: 100, heightMm: 100, quantityOnHand: 2 })
    const job = await createJob(owner, { layoutId, stockItemId: stockId })
    const done = jobSchema.parse((await completeJob(owner, job, { keepRemnant: true })).body)
    remnantName = done.remnant!.name
    // Three small squares on an A4 sheet (ISO 216: 210 × 297 mm); the first sits where the remnant's corner was cut away.
    const place = (xMm: number, yMm: number) => ({ id: randomUUID(), designId: smallId, pieceIndex: 0, sheet: 0, xMm, yMm, angleDeg: 0 })
    tagsLayoutId = (
      await api()
        .post(`${workspaceUrl(owner)}/layouts`)
        .set(bearer(owner.accessToken))
        .send({
          name: 'Small tags',
          stock: { kind: 'sheets', widthMm: 210, heightMm: 297, sheetCount: 1 },
          items: [{ designId: smallId, quantity: 3 }],
          placements: [place(5, 5), place(60, 10), place(60, 40)],
          options: { spacingMm: 2, marginMm: 5 },
        })
        .expect(201)
    ).body.id
    ;({ context, close } = await launchBrowser())
    page = await context.newPage()
    page.on('console', (message) => {
      if (message.type() === 'error') consoleErrors.push(message.text())
    })
  })

  afterAll(async () => {
    await close?.()
  })

  it('lays a layout onto a remnant from the stock picker and draws its outline', async () => {
    await signInThroughForm(page, baseUrl, owner.email, testPassword)
    await page.goto(`${baseUrl}/w/${owner.workspace.id}/layouts/${tagsLayoutId}`)
    await page.getByTestId('layout-canvas').waitFor()
    const option = page.getByTestId('stock-remnant-option').filter({ hasText: remnantName })
    await option.waitFor()
    expect(await option.getByTestId('stock-remnant-area').textContent()).toBe('75.0 cm²')
    await option.click()

    await expect.poll(() => page.getByTestId('layout-stock-remnant').isVisible()).toBe(true)
    expect(await page.getByTestId('layout-stock-remnant').textContent()).toContain('75.0 cm²')
    await expect.poll(() => page.getByTestId('layout-utilisation').textContent()).toBe('16.0 %')
    // The remnant's margin is inside its outline: the margin goes to 0, and the piece in the cut-away corner is flagged.
    await expect.poll(() => page.getByTestId('layout-conflicts').textContent()).toContain('1 piece outside the usable area')

    await page.mouse.move(0, 0)
    await page.screenshot({ path: path.join(artifactsDir, 'layout-on-remnant.png'), fullPage: true })
    expect(consoleErrors).toEqual([])
  })

  it('starts a new layout on a remnant from the stock page', async () => {
    await page.getByTestId('nav-stock').click()
    await page.waitForURL(/\/stock$/)
    const row = page.locator(`[data-testid="stock-row"][data-stock-name="${remnantName}"]`)
    await row.getByTestId('stock-actions').click()
    await page.getByTestId('stock-use-in-layout').click()
    await page.waitForURL(/\/layouts\/[0-9a-f-]{36}$/)
    await expect.poll(() => page.getByTestId('layout-stock-remnant').isVisible()).toBe(true)
    const layouts = (await api().get(`${workspaceUrl(owner)}/layouts`).set(bearer(owner.accessToken)).expect(200)).body
    const created = layouts.items.find((item: { name: string }) => item.name === `Layout on ${remnantName}`)
    expect(created.stock).toMatchObject({ kind: 'polygon', widthMm: 100, heightMm: 100 })
    expect(consoleErrors).toEqual([])
  })
})
