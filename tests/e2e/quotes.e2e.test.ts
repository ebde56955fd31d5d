import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { baseUrl, uniqueEmail } from '../api/helpers.js'
import { studioWithJob } from '../api/quotesFixtures.js'
import { artifactsDir, launchBrowser, signInThroughForm } from './browser.js'

describe('an owner prices a job, sends the quote, and the customer pays it (headless Chromium)', () => {
  let ownerBrowser: Awaited<ReturnType<typeof launchBrowser>>
  let customerBrowser: Awaited<ReturnType<typeof launchBrowser>>
  let studio: Awaited<ReturnType<typeof studioWithJob>>

  beforeAll(async () => {
    studio = await studioWithJob('e2e-quoter')
    ownerBrowser = await launchBrowser()
    customerBrowser = await launchBrowser()
  })
  afterAll(async () => {
    await ownerBrowser?.close()
    await customerBrowser?.close()
  })

  it('prices, sends, opens from the Outbox as the customer, pays through the local provider and shows paid', async () => {
    const customerEmail = uniqueEmail('e2e-customer')
    const owner = await ownerBrowser.context.newPage()
    await signInThroughForm(owner, baseUrl, studio.owner.email, studio.owner.password)

    // The owner prices the job from the quotes page.
    await owner.goto(`${baseUrl}/w/${studio.ws}/quotes`)
    await owner.getByTestId('quote-new').click()
    await owner.getByTestId('quote-job-select').click()
    await owner.getByRole('option', { name: /Job 1: Coasters for the market/ }).click()
    await owner.getByTestId('quote-create').click()
    await owner.waitForURL(/\/quotes\/[0-9a-f-]{36}$/)
    // Worked example by hand: 1 sheet per run × 3 runs at 4.50 a sheet.
    await expect.poll(() => owner.getByTestId('quote-line-arithmetic').first().textContent()).toBe('3 sheets × 4.50 = 13.50')
    const total = (await owner.getByTestId('quote-total').textContent())!.trim()

    await owner.getByTestId('quote-send').click()
    await owner.getByTestId('quote-send-email').fill(customerEmail)
    await owner.getByTestId('quote-send-confirm').click()
    await owner.getByTestId('quote-sent-banner').waitFor()
    await expect.poll(() => owner.getByTestId('quote-status').textContent()).toContain('Sent')

    // The customer opens the e-mail in the Outbox (another browser, no session) and follows the quote link.
    const customer = await customerBrowser.context.newPage()
    await customer.goto(`${baseUrl}/outbox`)
    const message = customer.getByTestId('outbox-message').filter({ hasText: customerEmail })
    await message.waitFor({ timeout: 20_000 })
    await message.click()
    await expect.poll(() => message.getByTestId('outbox-attachments').textContent()).toMatch(/quote-\d+\.pdf/)
    await message.getByTestId('outbox-link').filter({ hasText: '/q/' }).click()
    await customer.waitForURL(/\/q\/[A-Za-z0-9_-]{43}$/)
    await customer.getByTestId('public-quote').waitFor()
    expect((await customer.getByTestId('public-quote-total').textContent())!.trim()).toBe(total)
    await customer.screenshot({ path: path.join(artifactsDir, 'quote-public.png'), fullPage: true })

    await customer.getByTestId('public-quote-accept').click()
    await expect.poll(() => customer.getByTestId('quote-status').textContent()).toContain('Accepted')

    // Pay on the provider's page (the local fake), then come back to the quote.
    await customer.getByTestId('public-quote-pay').click()
    await customer.waitForURL(/127\.0\.0\.1:\d+\/pay\/cs_test_/)
    await customer.getByText('no real money').waitFor()
    await customer.getByTestId('fake-pay').click()
    await customer.waitForURL(/\/q\/[A-Za-z0-9_-]{43}\?payment=done$/)
    await customer.getByTestId('public-quote-paid').waitFor({ timeout: 15_000 })
    await customer.screenshot({ path: path.join(artifactsDir, 'quote-public-paid.png'), fullPage: true })

    // The owner sees it paid.
    await owner.reload()
    await expect.poll(() => owner.getByTestId('quote-status').textContent()).toContain('Paid')
  })
})
