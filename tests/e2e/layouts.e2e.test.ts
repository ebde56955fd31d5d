import { readFile } from 'node:fs/promises'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { uploadDesignsResponseSchema } from '../../shared/schemas/designs.js'
import { layoutDetailSchema, layoutListResponseSchema } from '../../shared/schemas/layouts.js'
import { addMember, api, baseUrl, bearer, signUp, testPassword, type SignedUpUser } from '../api/helpers.js'
import { artifactsDir, launchBrowser, signInThroughForm } from './browser.js'

/** A 30 × 30 mm square with a 10 × 10 mm window in its middle: 900 − 100 = 800 mm² of material. */
const windowSvg = `<svg xmlns="http://www.w3.org/2000/svg" width="40mm" height="40mm" viewBox="0 0 40 40">
  <path fill-rule="evenodd" d="M5 5H35V35H5Z M15 15H25V25H15Z"/>
</svg>`

/** A 50 × 20 mm strip: 1000 mm². */
const stripSvg = `<svg xmlns="http://www.w3.org/2000/svg" width="60mm" height="30mm" viewBox="0 0 60 30">
  <rect x="5" y="5" width="50" height="20"/>
</svg>`

/** ISO 216: an A4 sheet is 210 mm × 297 mm (the editor's first stock for a person working in millimetres). */
const A4_AREA_MM2 = 210 * 297
/** Both pieces' area over one A4 sheet, by hand: (800 + 1000) / 62 370 = 2.886 %. */
const EXPECTED_PERCENT = ((800 + 1000) / A4_AREA_MM2) * 100

function percentFrom(text: string | null): number {
  const match = /(-?\d+(?:\.\d+)?)\s*%/.exec(text ?? '')
  if (!match) throw new Error(`no percentage in “${text}”`)
  return Number(match[1])
}

/** Notifications, focus rings and the pointer say nothing about the page a screenshot is for. */
async function settleForScreenshot(page: Page): Promise<void> {
  for (const dismiss of await page.locator('.q-notification button[aria-label="Dismiss"]').all()) await dismiss.click().catch(() => {})
  await page.locator('.q-notification').first().waitFor({ state: 'detached', timeout: 6_000 }).catch(() => {})
  // The side panel scrolled down to reach auto-arrange: the figures belong at the top of the picture.
  await page.evaluate(() => document.querySelector('.layout-editor__panel')?.scrollTo(0, 0))
  await page.mouse.move(1, 1)
}

/** The centre of the selection frame drawn over the selected piece, in page pixels. */
async function selectionCentre(page: Page): Promise<{ x: number; y: number }> {
  const box = await page.getByTestId('layout-selection-frame').boundingBox()
  if (!box) throw new Error('nothing is selected')
  return { x: box.x + box.width / 2, y: box.y + box.height / 2 }
}

async function addDesign(page: Page, name: string): Promise<void> {
  await page.getByTestId('layout-design-search').fill(name)
  // Only the answer to this search lists this design alone: wait for it, so the click does not land on the previous
  // search's list while it is being replaced.
  const options = page.getByTestId('layout-design-option')
  const wanted = page.locator(`[data-testid="layout-design-option"][data-design-name="${name}"]`)
  await expect.poll(async () => (await options.count()) === 1 && (await wanted.count()) === 1).toBe(true)
  await wanted.click()
  await page.locator(`[data-testid="layout-item"][data-design-name="${name}"]`).waitFor()
}

describe('layout editor in the browser', () => {
  let owner: SignedUpUser
  let maker: Awaited<ReturnType<typeof addMember>>
  let context: BrowserContext
  let close: () => Promise<void>
  let page: Page
  let layoutUrl = ''
  let layoutId = ''
  const consoleErrors: string[] = []

  beforeAll(async () => {
    owner = await signUp('layouts')
    maker = await addMember(owner, 'maker', 'layout-maker')
    for (const [filename, svg] of [
      ['window-square.svg', windowSvg],
      ['strip-50x20.svg', stripSvg],
    ] as const) {
      const uploaded = await api()
        .post(`/api/workspaces/${owner.workspace.id}/designs`)
        .set(bearer(owner.accessToken))
        .attach('files', Buffer.from(svg, 'utf8'), { filename, contentType: 'image/svg+xml' })
      if (uploaded.status !== 201) throw new Error(`upload failed: ${uploaded.status} ${JSON.stringify(uploaded.body)}`)
      const design = uploadDesignsResponseSchema.parse(uploaded.body).designs[0]!
      // Elementary geometry, as above: the stored areas are the ones the expected figure is built from.
      expect(design.areaMm2).toBeCloseTo(filename.startsWith('window') ? 800 : 1000, 3)
    }
    ;({ context, close } = await launchBrowser())
    page = await openPage()
  })

  async function openPage(): Promise<Page> {
    const opened = await context.newPage()
    opened.on('console', (message) => {
      if (message.type() === 'error') consoleErrors.push(message.text())
    })
    opened.on('pageerror', (error) => consoleErrors.push(error.message))
    return opened
  }

  afterAll(async () => {
    await close?.()
  })

  it('lets a maker build a layout from two designs, shows an overlap while dragging, auto-arranges, saves and reloads the same figures', async () => {
    // Arrange: the maker signs in and opens the empty layout list.
    await signInThroughForm(page, baseUrl, maker.email, testPassword)
    await page.getByTestId('nav-layouts').click()
    await page.getByTestId('layout-list-empty').waitFor()

    // Act: a new layout with one copy of each design.
    await page.getByTestId('layout-new').click()
    await page.waitForURL(/\/layouts\/[0-9a-f-]{36}$/)
    layoutUrl = page.url()
    layoutId = layoutUrl.split('/').pop()!
    await page.getByTestId('layout-canvas-empty').waitFor()
    await addDesign(page, 'window-square')
    await addDesign(page, 'strip-50x20')

    // Assert: both pieces are placed apart, inside the usable area, and the layout is not saved yet.
    await expect.poll(() => page.getByTestId('layout-placed').textContent()).toBe('2 of 2')
    expect(await page.getByTestId('layout-conflicts').textContent()).toContain('No overlaps')
    expect(await page.getByTestId('layout-save-state').getAttribute('data-state')).toBe('unsaved')
    expect(percentFrom(await page.getByTestId('layout-utilisation').textContent())).toBeCloseTo(EXPECTED_PERCENT, 1)

    // Act: select the square and then the strip with Tab on the canvas, and drag the strip onto the square.
    await page.getByTestId('layout-canvas').focus()
    await page.keyboard.press('Tab')
    const square = await selectionCentre(page)
    await page.keyboard.press('Tab')
    const strip = await selectionCentre(page)
    expect(strip.x).toBeGreaterThan(square.x)
    await page.mouse.move(strip.x, strip.y)
    await page.mouse.down()
    for (let step = 1; step <= 12; step++) await page.mouse.move(strip.x + ((square.x - strip.x) * step) / 12, strip.y + ((square.y - strip.y) * step) / 12)

    // Assert: the overlap is shown at once while dragging, and stays listed after the drop.
    await expect.poll(() => page.getByTestId('layout-drag-note').textContent()).toContain('Overlaps another piece')
    await page.mouse.up()
    await expect.poll(() => page.getByTestId('layout-conflicts').textContent()).toContain('2 pieces overlap')

    // Undo puts the strip back; redo brings the overlap back.
    await page.keyboard.press('Control+z')
    await expect.poll(() => page.getByTestId('layout-conflicts').textContent()).toContain('No overlaps')
    await page.keyboard.press('Control+Shift+z')
    await expect.poll(() => page.getByTestId('layout-conflicts').textContent()).toContain('2 pieces overlap')

    // Act: auto-arrange for a few seconds.
    await page.getByTestId('layout-auto-arrange').locator('.q-select').click()
    await page.getByRole('option', { name: '5 s' }).click()
    await page.getByTestId('layout-auto-arrange-start').click()
    await page.getByTestId('layout-auto-arrange-progress').waitFor()
    await page.getByTestId('layout-auto-arrange-progress').waitFor({ state: 'detached', timeout: 45_000 })

    // Assert: arranged without overlaps, every piece placed, same utilisation (same pieces, one sheet).
    await expect.poll(() => page.getByTestId('layout-conflicts').textContent()).toContain('No overlaps')
    expect(await page.getByTestId('layout-placed').textContent()).toBe('2 of 2')
    const arrangedText = await page.getByTestId('layout-utilisation').textContent()
    expect(percentFrom(arrangedText)).toBeCloseTo(EXPECTED_PERCENT, 1)
    const wasteText = await page.getByTestId('layout-waste').textContent()

    // Act: save.
    await page.getByTestId('layout-save').click()
    await page.locator('[data-testid="layout-save-state"][data-state="saved"]').waitFor()

    // Assert: the server computed the same figures from the stored geometry.
    const stored = layoutDetailSchema.parse((await api().get(`/api/workspaces/${owner.workspace.id}/layouts/${layoutId}`).set(bearer(owner.accessToken))).body)
    expect(stored.version).toBe(2)
    expect(stored.figures.utilisation * 100).toBeCloseTo(EXPECTED_PERCENT, 6)
    expect(stored.figures.placedCount).toBe(2)
    expect(stored.placements).toHaveLength(2)

    await settleForScreenshot(page)
    await page.screenshot({ path: path.join(artifactsDir, 'layout-editor.png') })

    // Act: reload the page.
    await page.reload()
    await page.getByTestId('layout-utilisation').waitFor()

    // Assert: the same figures, nothing unsaved, nothing to restore.
    expect(await page.getByTestId('layout-utilisation').textContent()).toBe(arrangedText)
    expect(await page.getByTestId('layout-waste').textContent()).toBe(wasteText)
    expect(await page.getByTestId('layout-placed').textContent()).toBe('2 of 2')
    expect(await page.getByTestId('layout-save-state').getAttribute('data-state')).toBe('saved')
    expect(await page.getByTestId('layout-draft-banner').count()).toBe(0)

    // Act: export the sheet as SVG from the editor.
    await page.getByTestId('layout-export').click()
    const [downloaded] = await Promise.all([page.waitForEvent('download'), page.getByTestId('layout-export-svg-0').click()])
    const exported = await readFile(await downloaded.path())

    // Assert: an SVG sized in millimetres (W3C SVG units) with both pieces in it.
    expect(downloaded.suggestedFilename()).toMatch(/\.svg$/)
    expect(exported.toString('utf8')).toMatch(/<svg[^>]*width="[0-9.]+mm"/)
    expect(exported.toString('utf8').match(/<g\b/g)?.length ?? 0).toBeGreaterThanOrEqual(2)
    expect(consoleErrors).toEqual([])
  }, 120_000)

  it('keeps unsaved changes of a closed tab and re-applies them over a newer saved version after a refused save', async () => {
    // Arrange: the editor afresh (the last test ended in the Export menu, and a closing menu hands the focus back to
    // its button some time after it has gone, which took the keys below away from the canvas), then an unsaved change:
    // a nudge of the strip.
    await page.reload()
    await page.getByTestId('layout-utilisation').waitFor()
    await page.getByTestId('layout-canvas').focus()
    expect(await page.evaluate(() => document.activeElement?.getAttribute('data-testid'))).toBe('layout-canvas')
    await page.keyboard.press('Tab')
    await page.keyboard.press('Tab')
    await page.getByTestId('layout-selection-frame').waitFor()
    await page.keyboard.press('Shift+ArrowDown')
    await expect.poll(() => page.getByTestId('layout-save-state').getAttribute('data-state')).toBe('unsaved')

    // Act: close the tab at once (before the draft's usual delay), and open the layout in a new one.
    await page.close({ runBeforeUnload: true })
    page = await openPage()
    await page.goto(layoutUrl)

    // Assert: the change is offered back and restores.
    await page.getByTestId('layout-draft-banner').waitFor()
    await page.getByTestId('layout-draft-restore').click()
    await expect.poll(() => page.getByTestId('layout-save-state').getAttribute('data-state')).toBe('unsaved')

    // Arrange: meanwhile the owner renames the layout and saves (version 3).
    const current = layoutDetailSchema.parse((await api().get(`/api/workspaces/${owner.workspace.id}/layouts/${layoutId}`).set(bearer(owner.accessToken))).body)
    const { id: _id, figures: _figures, designIds: _designIds, createdAt: _createdAt, updatedAt: _updatedAt, updatedByName: _updatedByName, ...body } = current
    const renamed = await api()
      .put(`/api/workspaces/${owner.workspace.id}/layouts/${layoutId}`)
      .set(bearer(owner.accessToken))
      .send({ ...body, name: 'Renamed by the owner' })
    expect(renamed.status).toBe(200)

    // Act: the maker saves over version 2.
    await page.getByTestId('layout-save').click()

    // Assert: refused, explained, and the reload keeps the maker's change on top of the owner's.
    await page.getByTestId('layout-conflict-dialog').waitFor()
    await page.getByTestId('layout-conflict-reload').click()
    await expect.poll(() => page.getByTestId('layout-name').inputValue()).toBe('Renamed by the owner')
    expect(await page.getByTestId('layout-save-state').getAttribute('data-state')).toBe('unsaved')
    await page.getByTestId('layout-save').click()
    await page.locator('[data-testid="layout-save-state"][data-state="saved"]').waitFor()
    const saved = layoutDetailSchema.parse((await api().get(`/api/workspaces/${owner.workspace.id}/layouts/${layoutId}`).set(bearer(owner.accessToken))).body)
    expect(saved.version).toBe(4)
    expect(saved.name).toBe('Renamed by the owner')
    // The nudge (10 mm down) survived: one piece sits 10 mm lower than in version 2.
    const movedDown = saved.placements.filter((placement) => !current.placements.some((before) => before.id === placement.id && before.yMm === placement.yMm))
    expect(movedDown).toHaveLength(1)
    expect(movedDown[0]!.yMm - current.placements.find((before) => before.id === movedDown[0]!.id)!.yMm).toBeCloseTo(10, 6)
    // The refused save is a failed request in the console; nothing else may be.
    expect(consoleErrors.filter((text) => !text.includes('409'))).toEqual([])
    consoleErrors.splice(0)
  }, 60_000)

  it('shows a viewer the layout read-only', async () => {
    // Arrange: a viewer of the same workspace on a clean browser session.
    const viewer = await addMember(owner, 'viewer', 'layout-viewer')
    await context.clearCookies()
    await signInThroughForm(page, baseUrl, viewer.email, testPassword)

    // Act: open the list and the layout.
    await page.getByTestId('nav-layouts').click()
    await page.getByTestId('layout-card').first().waitFor()
    const list = layoutListResponseSchema.parse((await api().get(`/api/workspaces/${owner.workspace.id}/layouts`).set(bearer(owner.accessToken))).body)
    expect(await page.getByTestId('layout-card').count()).toBe(list.total)
    expect(await page.getByTestId('layout-new').count()).toBe(0)
    expect(await page.getByTestId('layout-delete').count()).toBe(0)
    await page.getByTestId('layout-open').first().click()
    await page.getByTestId('layout-read-only').waitFor()

    // Assert: no saving, no tools that change anything, and a drag moves nothing.
    expect(await page.getByTestId('layout-save').count()).toBe(0)
    expect(await page.getByTestId('layout-auto-arrange').count()).toBe(0)
    expect(await page.getByTestId('layout-design-search').count()).toBe(0)
    expect(await page.getByTestId('layout-rotate').isDisabled()).toBe(true)
    await page.getByTestId('layout-canvas').focus()
    await page.keyboard.press('Tab')
    const before = await selectionCentre(page)
    await page.mouse.move(before.x, before.y)
    await page.mouse.down()
    await page.mouse.move(before.x + 80, before.y + 40, { steps: 6 })
    await page.mouse.up()
    expect(await selectionCentre(page)).toEqual(before)
    await page.keyboard.press('Delete')
    expect(await page.getByTestId('layout-placed').textContent()).toBe('2 of 2')
    expect(consoleErrors).toEqual([])
  }, 60_000)
})
