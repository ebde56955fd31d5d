import { mkdtempSync, mkdirSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { chromium, type BrowserContext } from 'playwright-core'

export const artifactsDir = path.resolve('tests/e2e/artifacts')

/**
 * Debian's Chromium, headless, in a fresh profile. The networking flags keep it from calling out:
 * this machine reaches nothing but package registries.
 */
export async function launchBrowser(): Promise<{ context: BrowserContext; close: () => Promise<void> }> {
  const profileDir = mkdtempSync(path.join(tmpdir(), 'sheetsmith-e2e-'))
  mkdirSync(artifactsDir, { recursive: true })
  const context = await chromium.launchPersistentContext(profileDir, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1280, height: 800 },
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'],
  })
  context.setDefaultTimeout(15_000)
  return {
    context,
    close: async () => {
      await context.close()
      rmSync(profileDir, { recursive: true, force: true })
    },
  }
}

/** Signs in through the form, as a person would, and waits for the workspace home. */
export async function signInThroughForm(page: import('playwright-core').Page, baseUrl: string, email: string, password: string): Promise<void> {
  await page.goto(`${baseUrl}/signin`)
  await page.getByTestId('signin-email').fill(email)
  await page.getByTestId('signin-password').fill(password)
  await page.getByTestId('signin-submit').click()
  await page.waitForURL(/\/w\/[^/]+$/)
}


/** Notifications, focus rings and hover say nothing about the page a screenshot is for. */
export async function settleForScreenshot(page: import('playwright-core').Page): Promise<void> {
  for (const dismiss of await page.locator('.q-notification button[aria-label="Dismiss"]').all()) await dismiss.click().catch(() => {})
  // Notifications leave on their own within five seconds; a screenshot with one in it is still a screenshot.
  await page.locator('.q-notification').first().waitFor({ state: 'detached', timeout: 6_000 }).catch(() => {})
  await page.evaluate(() => {
    ;(document.activeElement as HTMLElement | null)?.blur()
    window.scrollTo(0, 0)
  })
  await page.mouse.move(0, 0)
}
