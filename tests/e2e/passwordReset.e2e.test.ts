import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { api, baseUrl, signUp, type SignedUpUser } from '../api/helpers.js'
import { launchBrowser, signInThroughForm } from './browser.js'

describe('a forgotten password is reset from the e-mailed link (headless Chromium)', () => {
  let browser: Awaited<ReturnType<typeof launchBrowser>>
  let person: SignedUpUser

  beforeAll(async () => {
    person = await signUp('e2e-forgetful')
    browser = await launchBrowser()
  })
  afterAll(() => browser?.close())

  it('asks for a link, follows it from the Outbox, sets a new password and signs in with it', async () => {
    const page = await browser.context.newPage()
    await page.goto(`${baseUrl}/forgot-password`)
    await page.getByTestId('forgot-email').fill(person.email)
    await page.getByTestId('forgot-submit').click()
    await page.getByTestId('forgot-sent').waitFor()

    await page.goto(`${baseUrl}/outbox`)
    const message = page.getByTestId('outbox-message').filter({ hasText: person.email })
    await message.waitFor({ timeout: 20_000 })
    await message.click()
    await message.getByTestId('outbox-link').first().click()
    await page.waitForURL(/\/reset-password\?token=/)

    // The two entries must match before anything is sent.
    await page.getByTestId('reset-password').fill('a-fresh-password-77')
    await page.getByTestId('reset-password-confirm').fill('a-different-one-88')
    await page.getByTestId('reset-submit').click()
    await expect.poll(() => page.getByText('The two passwords differ').count()).toBeGreaterThan(0)

    await page.getByTestId('reset-password-confirm').fill('a-fresh-password-77')
    await page.getByTestId('reset-submit').click()
    await page.waitForURL(/\/signin/)
    await signInThroughForm(page, baseUrl, person.email, 'a-fresh-password-77')
    // The old password no longer works.
    await api().post('/api/auth/signin').send({ email: person.email, password: person.password }).expect(401)
  })
})
