import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext } from 'playwright-core'
import { baseUrl, uniqueEmail } from '../api/helpers.js'
import { artifactsDir, launchBrowser } from './browser.js'

describe('a new studio signs up and brings in a member (headless Chromium)', () => {
  let browser: Awaited<ReturnType<typeof launchBrowser>>
  let inviteeBrowser: Awaited<ReturnType<typeof launchBrowser>> | undefined
  let context: BrowserContext

  beforeAll(async () => {
    browser = await launchBrowser()
    context = browser.context
  })
  afterAll(async () => {
    await inviteeBrowser?.close()
    await browser?.close()
  })

  it('signs up, invites by e-mail, and the invitee joins from the Outbox link', async () => {
    const ownerEmail = uniqueEmail('e2e-owner')
    const memberEmail = uniqueEmail('e2e-member')
    const page = await context.newPage()
    const consoleErrors: string[] = []
    page.on('console', (message) => {
      if (message.type() === 'error') consoleErrors.push(message.text())
    })

    await page.goto(`${baseUrl}/signup`)
    await page.getByTestId('signup-name').fill('Rowan Ashby')
    await page.getByTestId('signup-email').fill(ownerEmail)
    await page.getByTestId('signup-password').fill('a-long-enough-password-1')
    await page.getByTestId('signup-workspace').fill('Lantern Row Studio')
    await page.getByTestId('signup-submit').click()
    await page.waitForURL(/\/w\/[0-9a-f-]{36}$/)
    await expect.poll(() => page.getByTestId('workspace-switcher').innerText()).toContain('Lantern Row Studio')

    await page.getByTestId('nav-members').click()
    await page.waitForURL(/\/members$/)
    await page.getByTestId('invite-email').fill(memberEmail)
    await page.getByTestId('invite-role').click()
    await page.getByTestId('invite-role-option-viewer').click()
    await page.getByTestId('invite-submit').click()
    await page.getByTestId('invite-row').filter({ hasText: memberEmail }).waitFor()

    // The invitee, in a separate browser session, reads the message in the development Outbox.
    inviteeBrowser = await launchBrowser()
    const inviteePage = await inviteeBrowser.context.newPage()
    await inviteePage.goto(`${baseUrl}/outbox`)
    const message = inviteePage.getByTestId('outbox-message').filter({ hasText: memberEmail })
    await message.waitFor({ timeout: 20_000 })
    await message.click()
    await message.getByTestId('outbox-link').first().click()
    await inviteePage.waitForURL(/\/invite\//)
    await inviteePage.getByTestId('invite-accept-name').fill('Tamsin Reed')
    await inviteePage.getByTestId('invite-accept-password').fill('another-long-password-2')
    await inviteePage.getByTestId('invite-accept-password-confirm').fill('another-long-password-2')
    await inviteePage.getByTestId('invite-accept-submit').click()

    await inviteePage.waitForURL(/\/signin/)
    expect(await inviteePage.getByTestId('signin-email').inputValue()).toBe(memberEmail)
    await inviteePage.getByTestId('signin-password').fill('another-long-password-2')
    await inviteePage.getByTestId('signin-submit').click()
    await inviteePage.waitForURL(/\/w\/[0-9a-f-]{36}$/)
    await expect.poll(() => inviteePage.getByTestId('workspace-switcher').innerText()).toContain('Lantern Row Studio')
    await expect.poll(() => inviteePage.getByTestId('workspace-role').innerText()).toMatch(/viewer/i)

    // The owner sees the new member in the table.
    await page.reload()
    const rows = page.getByTestId('member-row')
    await expect.poll(() => rows.count()).toBe(2)
    await expect.poll(() => rows.filter({ hasText: memberEmail }).innerText()).toMatch(/viewer/i)
    await page.screenshot({ path: path.join(artifactsDir, 'members.png'), fullPage: true })
    expect(consoleErrors).toEqual([])
  })
})
