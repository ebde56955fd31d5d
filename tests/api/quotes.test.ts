import { randomBytes, randomUUID } from 'node:crypto'
import request from 'supertest'
import Stripe from 'stripe'
import { beforeAll, describe, expect, it } from 'vitest'
import { loadConfig } from '../../server/config.js'
import { roundHalfUp } from '../../shared/quotes/money.js'
import { publicQuoteSchema, quoteDetailSchema, quoteListResponseSchema, type QuoteDetail } from '../../shared/schemas/quotes.js'
import { addMember, api, bearer, signUp, uniqueEmail, waitForMail } from './helpers.js'
import { backdateExpiry, pricing, storedQuote, studioWithJob } from './quotesFixtures.js'

const payments = loadConfig().payments
const signer = new Stripe('sk_test_signing_only')

async function createQuote(studio: Awaited<ReturnType<typeof studioWithJob>>): Promise<QuoteDetail> {
  const response = await api().post(studio.quotesUrl).set(bearer(studio.owner.accessToken)).send({ source: { kind: 'job', jobId: studio.jobId } }).expect(201)
  return quoteDetailSchema.parse(response.body)
}

async function sendQuote(studio: Awaited<ReturnType<typeof studioWithJob>>, quoteId: string, customerEmail: string) {
  const response = await api().post(`${studio.quotesUrl}/${quoteId}/send`).set(bearer(studio.owner.accessToken)).send({ customerEmail, message: 'Thanks for asking!' }).expect(200)
  return quoteDetailSchema.parse(response.body)
}

function signedEvent(object: Record<string, unknown>, secret = payments.webhookSecret) {
  const payload = JSON.stringify({ id: `evt_test_${randomBytes(6).toString('hex')}`, object: 'event', type: 'checkout.session.completed', created: Math.floor(Date.now() / 1000), data: { object } })
  return { payload, signature: signer.webhooks.generateTestHeaderString({ payload, secret }) }
}

const tokenOf = (url: string) => new URL(url).pathname.split('/').pop()!

describe('pricing settings', () => {
  it('lets the owner save them and every member read them; makers may not write', async () => {
    const owner = await signUp('pricer')
    const url = `/api/workspaces/${owner.workspace.id}/pricing`
    const before = await api().get(url).set(bearer(owner.accessToken)).expect(200)
    expect(before.body).toMatchObject({ saved: false, currency: 'EUR', machineRatePerHourMinor: 0 })

    const saved = await api().put(url).set(bearer(owner.accessToken)).send(pricing).expect(200)
    expect(saved.body).toMatchObject({ saved: true, currency: 'EUR', taxRatePercent: 20 })

    const maker = await addMember(owner, 'maker')
    await api().get(url).set(bearer(maker.accessToken)).expect(200)
    await api().put(url).set(bearer(maker.accessToken)).send(pricing).expect(403)

    // The pricing prefix reaches the same settings, with the same roles.
    const underPricing = await api().get(`/api/pricing/${owner.workspace.id}`).set(bearer(maker.accessToken)).expect(200)
    expect(underPricing.body).toEqual(saved.body)
    await api().put(`/api/pricing/${owner.workspace.id}`).set(bearer(maker.accessToken)).send(pricing).expect(403)
    const stranger = await signUp('pricing-stranger')
    await api().get(`/api/pricing/${owner.workspace.id}`).set(bearer(stranger.accessToken)).expect(404)
  })

  it('refuses bad values and names the field', async () => {
    const owner = await signUp('badpricer')
    const url = `/api/workspaces/${owner.workspace.id}/pricing`
    const response = await api().put(url).set(bearer(owner.accessToken)).send({ ...pricing, currency: 'euro', setupFeeMinor: 10.5 }).expect(400)
    expect(Object.keys(response.body.error.fields)).toEqual(expect.arrayContaining(['body.currency', 'body.setupFeeMinor']))
  })
})

describe('quotes from jobs', () => {
  let studio: Awaited<ReturnType<typeof studioWithJob>>

  beforeAll(async () => {
    studio = await studioWithJob('quoter')
  })

  it('prices a job from its stock, cut plan and the workspace rates, showing each line’s arithmetic', async () => {
    const quote = await createQuote(studio)
    const [version] = quote.versions
    const lines = Object.fromEntries(version!.lines.map((line) => [line.kind, line]))

    // Worked example by hand: 1 sheet per run × 3 runs × 4.50 = 13.50; markup 40 % = 5.40;
    // weeding 1.5 min × (2 pieces × 3 runs) = 9 min = 0.15 h × 18.00 = 2.70; setup 10.00.
    expect(lines.material).toMatchObject({ quantity: 3, unit: 'sheet', unitPriceMinor: 450, amountMinor: 1350, arithmetic: '3 sheets × 4.50 = 13.50' })
    expect(lines.markup).toMatchObject({ amountMinor: 540, arithmetic: '13.50 × 40% = 5.40' })
    expect(lines.labour).toMatchObject({ quantity: 0.15, amountMinor: 270, arithmetic: '0.15 h × 18.00 = 2.70' })
    expect(lines.setup).toMatchObject({ amountMinor: 1000 })
    // Machine time: the cut plan's estimate of one run (same layout, default cutter) × 3 runs, in hours × 24.00.
    const hours = Number(((studio.cutTimePerRunS * 3) / 3600).toFixed(4))
    expect(lines.machine!.quantity).toBe(hours)
    expect(lines.machine!.amountMinor).toBe(roundHalfUp(hours * 2400))

    const subtotal = 1350 + 540 + 270 + 1000 + lines.machine!.amountMinor
    expect(version!.subtotalMinor).toBe(subtotal)
    expect(version!.minimumTopUpMinor).toBe(Math.max(0, 2000 - subtotal))
    expect(version!.taxMinor).toBe(roundHalfUp((Math.max(subtotal, 2000) * 20) / 100))
    expect(quote).toMatchObject({ status: 'draft', currency: 'EUR', customerName: 'Rowan Pell', title: 'Coasters for the market', currentVersion: 1 })
    expect(quote.source).toMatchObject({ kind: 'job', jobId: studio.jobId })
  })

  it('keeps every edit of the lines as a new version and refuses an edit of a stale version', async () => {
    const quote = await createQuote(studio)
    const lines = quote.versions[0]!.lines.map(({ kind, description, quantity, unit, unitPriceMinor }) => ({ kind, description, quantity, unit, unitPriceMinor }))
    lines[0]!.quantity = 4
    lines.push({ kind: 'custom', description: 'Gift wrapping', quantity: 2, unit: 'piece', unitPriceMinor: 150 })

    const edited = quoteDetailSchema.parse(
      (await api().patch(`${studio.quotesUrl}/${quote.id}`).set(bearer(studio.owner.accessToken)).send({ version: 1, lines, note: 'One more sheet' }).expect(200)).body,
    )
    expect(edited.currentVersion).toBe(2)
    expect(edited.versions.map((version) => version.version)).toEqual([2, 1])
    const current = edited.versions[0]!
    expect(current.lines[0]!.arithmetic).toBe('4 sheets × 4.50 = 18.00')
    expect(current.lines[1]!.arithmetic).toBe('18.00 × 40% = 7.20') // the markup follows the material
    expect(current.lines.at(-1)!.arithmetic).toBe('2 pieces × 1.50 = 3.00')
    expect(edited.versions[1]!.lines[0]!.amountMinor).toBe(1350)

    const stale = await api().patch(`${studio.quotesUrl}/${quote.id}`).set(bearer(studio.owner.accessToken)).send({ version: 1, title: 'Late change' }).expect(409)
    expect(stale.body.error.details).toMatchObject({ currentVersion: 2 })
  })

  it('refuses bad lines and sources with the field named', async () => {
    const quote = await createQuote(studio)
    const badLine = await api()
      .patch(`${studio.quotesUrl}/${quote.id}`)
      .set(bearer(studio.owner.accessToken))
      .send({ version: 1, lines: [{ kind: 'material', description: '', quantity: -1, unit: 'sheet', unitPriceMinor: 1 }] })
      .expect(400)
    expect(Object.keys(badLine.body.error.fields)).toEqual(expect.arrayContaining(['body.lines.0.description', 'body.lines.0.quantity']))
    const badJob = await api().post(studio.quotesUrl).set(bearer(studio.owner.accessToken)).send({ source: { kind: 'job', jobId: randomUUID() } }).expect(400)
    expect(badJob.body.error.fields).toHaveProperty(['body.source.jobId'])
    const badKind = await api().post(studio.quotesUrl).set(bearer(studio.owner.accessToken)).send({ source: { kind: 'invoice' } }).expect(400)
    expect(Object.keys(badKind.body.error.fields)[0]).toMatch(/^body\.source/)
  })

  it('lets makers read quotes, not price them, and keeps viewers and strangers out', async () => {
    const quote = await createQuote(studio)
    const maker = await addMember(studio.owner, 'maker')
    const viewer = await addMember(studio.owner, 'viewer')
    const stranger = await signUp('stranger')
    await api().get(`${studio.quotesUrl}/${quote.id}`).set(bearer(maker.accessToken)).expect(200)
    await api().post(studio.quotesUrl).set(bearer(maker.accessToken)).send({ source: { kind: 'job', jobId: studio.jobId } }).expect(403)
    await api().get(studio.quotesUrl).set(bearer(viewer.accessToken)).expect(403)
    await api().get(`${studio.quotesUrl}/${quote.id}`).set(bearer(stranger.accessToken)).expect(404)
  })

  it('lists quotes newest first with a status filter', async () => {
    const first = await createQuote(studio)
    await sendQuote(studio, first.id, uniqueEmail('lister'))
    const drafts = quoteListResponseSchema.parse((await api().get(`${studio.quotesUrl}?status=draft`).set(bearer(studio.owner.accessToken)).expect(200)).body)
    expect(drafts.items.every((item) => item.status === 'draft')).toBe(true)
    const sent = quoteListResponseSchema.parse((await api().get(`${studio.quotesUrl}?status=sent`).set(bearer(studio.owner.accessToken)).expect(200)).body)
    expect(sent.items.map((item) => item.id)).toContain(first.id)
    await api().get(`${studio.quotesUrl}?status=lost`).set(bearer(studio.owner.accessToken)).expect(400)
  })
})

describe('sending a quote and getting paid', () => {
  let studio: Awaited<ReturnType<typeof studioWithJob>>

  beforeAll(async () => {
    studio = await studioWithJob('sender')
  })

  it('e-mails the customer a link, a pay link and the PDF; paying through the provider marks it paid once', async () => {
    const quote = await createQuote(studio)
    const customer = uniqueEmail('customer')
    const sent = await sendQuote(studio, quote.id, customer)
    expect(sent.status).toBe('sent')
    expect(sent.publicUrl).toMatch(/\/q\/[A-Za-z0-9_-]{43}$/)
    expect(sent.payUrl).toMatch(new RegExp(`^http://127\\.0\\.0\\.1:${payments.fakePort}/pay/cs_test_`))

    const mail = await waitForMail(customer, `Quote ${quote.number}`)
    expect(mail.links).toContain(sent.publicUrl)
    expect(mail.links).toContain(sent.payUrl)
    expect(mail.attachments).toEqual([expect.objectContaining({ filename: `quote-${quote.number}.pdf`, contentType: 'application/pdf' })])

    const total = sent.versions[0]!.totalMinor
    const fake = request(new URL(sent.payUrl!).origin)
    const session = await fake.get(`/v1/checkout/sessions/${new URL(sent.payUrl!).pathname.split('/').pop()}`).expect(200)
    expect(session.body).toMatchObject({ amount_total: total, currency: 'eur', customer_email: customer, status: 'open' })

    // The customer presses Pay on the provider's page: the provider sends its signed event, then returns them.
    const paid = await fake.post(`${new URL(sent.payUrl!).pathname}/complete`).expect(303)
    expect(paid.headers.location).toBe(`${sent.publicUrl}?payment=done`)

    const after = quoteDetailSchema.parse((await api().get(`${studio.quotesUrl}/${quote.id}`).set(bearer(studio.owner.accessToken)).expect(200)).body)
    expect(after.status).toBe('paid')
    expect(after.paidAt).not.toBeNull()
    const publicView = publicQuoteSchema.parse((await api().get(`/api/public/quotes/${tokenOf(sent.publicUrl!)}`).expect(200)).body)
    expect(publicView).toMatchObject({ status: 'paid', canPay: false, canRespond: false })
    // The customer reads no markup line: it is folded into the material, and the lines still add up to the subtotal.
    const owners = quoteDetailSchema.parse((await api().get(`${studio.quotesUrl}/${quote.id}`).set(bearer(studio.owner.accessToken)).expect(200)).body)
    const ownerLines = owners.versions.find((version) => version.version === owners.currentVersion)!.lines
    expect(ownerLines.some((line) => line.kind === 'markup' && line.amountMinor > 0)).toBe(true)
    expect(publicView.lines.map((line) => line.description)).not.toContain(ownerLines.find((line) => line.kind === 'markup')!.description)
    expect(publicView.lines.reduce((sum, line) => sum + line.amountMinor, 0)).toBe(publicView.subtotalMinor)

    // Paying again changes nothing: the page says it is complete, a replayed event is not applied.
    await fake.post(`${new URL(sent.payUrl!).pathname}/complete`).expect(303)
    const replay = signedEvent({ id: session.body.id, object: 'checkout.session', amount_total: total, currency: 'eur', payment_status: 'paid', metadata: session.body.metadata })
    const replayed = await api().post('/api/payments/webhook').set('content-type', 'application/json').set('stripe-signature', replay.signature).send(replay.payload).expect(200)
    expect(replayed.body).toEqual({ received: true, applied: false })
    const final = quoteDetailSchema.parse((await api().get(`${studio.quotesUrl}/${quote.id}`).set(bearer(studio.owner.accessToken)).expect(200)).body)
    expect(final.events.filter((event) => event.toStatus === 'paid')).toHaveLength(1)
  })

  it('refuses a forged or unsigned payment event with 400 and leaves the quote as it was', async () => {
    const quote = await createQuote(studio)
    const sent = await sendQuote(studio, quote.id, uniqueEmail('forged'))
    const stored = await storedQuote(quote.id)
    const object = { id: stored.checkoutSessionId, object: 'checkout.session', amount_total: sent.versions[0]!.totalMinor, currency: 'eur', payment_status: 'paid', metadata: { quoteId: quote.id, workspaceId: studio.ws, version: '1' } }

    const forged = signedEvent(object, 'whsec_someone_else_entirely')
    const refused = await api().post('/api/payments/webhook').set('content-type', 'application/json').set('stripe-signature', forged.signature).send(forged.payload).expect(400)
    expect(refused.body.error.message).toMatch(/signature/)
    await api().post('/api/payments/webhook').set('content-type', 'application/json').send(forged.payload).expect(400)
    // A correct signature over a changed body is a forgery too.
    const genuine = signedEvent(object)
    await api().post('/api/payments/webhook').set('content-type', 'application/json').set('stripe-signature', genuine.signature).send(genuine.payload.replace('"paid"', '"paid" ')).expect(400)

    const after = quoteDetailSchema.parse((await api().get(`${studio.quotesUrl}/${quote.id}`).set(bearer(studio.owner.accessToken)).expect(200)).body)
    expect(after.status).toBe('sent')
    expect(after.paidAt).toBeNull()
    expect((await storedQuote(quote.id)).updatedAt).toEqual(stored.updatedAt)
  })

  it('does not mark paid for the wrong amount or currency', async () => {
    const quote = await createQuote(studio)
    const sent = await sendQuote(studio, quote.id, uniqueEmail('short'))
    const metadata = { quoteId: quote.id, workspaceId: studio.ws, version: '1' }
    for (const [amount, currency] of [[sent.versions[0]!.totalMinor - 1, 'eur'], [sent.versions[0]!.totalMinor, 'usd']] as const) {
      const event = signedEvent({ id: 'cs_test_other', object: 'checkout.session', amount_total: amount, currency, payment_status: 'paid', metadata })
      const answer = await api().post('/api/payments/webhook').set('content-type', 'application/json').set('stripe-signature', event.signature).send(event.payload).expect(200)
      expect(answer.body.applied).toBe(false)
    }
    expect((await storedQuote(quote.id)).status).toBe('sent')
  })

  it('shows the customer only their quote: no ids, no other quotes, no workspace routes', async () => {
    const first = await sendQuote(studio, (await createQuote(studio)).id, uniqueEmail('first'))
    const second = await sendQuote(studio, (await createQuote(studio)).id, uniqueEmail('second'))
    const firstToken = tokenOf(first.publicUrl!)

    const view = await api().get(`/api/public/quotes/${firstToken}`).expect(200)
    expect(view.body.number).toBe(first.number)
    const text = JSON.stringify(view.body)
    for (const secret of [first.id, second.id, studio.ws, studio.jobId, studio.owner.user.id, first.customerEmail]) expect(text).not.toContain(secret)
    expect(view.body.studioName).toBe(studio.owner.workspace.name)

    await api().get(`/api/public/quotes/${randomBytes(32).toString('base64url')}`).expect(404)
    await api().get(`/api/public/quotes/${firstToken.slice(0, -1)}${firstToken.endsWith('A') ? 'B' : 'A'}`).expect(404)
    await api().get('/api/public/quotes/short').expect(400)
    // The link's token opens nothing else.
    await api().get(studio.quotesUrl).set(bearer(firstToken)).expect(401)
    await api().get(`${studio.quotesUrl}/${second.id}`).set(bearer(firstToken)).expect(401)
    await api().get(`/api/public/quotes/${firstToken}/../${second.id}`).expect(404)
  })

  it('lets the customer accept once and not decline afterwards; an edit withdraws the old link', async () => {
    const sent = await sendQuote(studio, (await createQuote(studio)).id, uniqueEmail('accepter'))
    const token = tokenOf(sent.publicUrl!)
    const accepted = await api().post(`/api/public/quotes/${token}/accept`).expect(200)
    expect(accepted.body).toMatchObject({ status: 'accepted', canRespond: false, canPay: true })
    await api().post(`/api/public/quotes/${token}/decline`).expect(409)
    await api().patch(`${studio.quotesUrl}/${sent.id}`).set(bearer(studio.owner.accessToken)).send({ version: 1, title: 'Changed' }).expect(409)

    const other = await sendQuote(studio, (await createQuote(studio)).id, uniqueEmail('reviser'))
    const lines = other.versions[0]!.lines.map(({ kind, description, quantity, unit, unitPriceMinor }) => ({ kind, description, quantity, unit, unitPriceMinor }))
    const revised = await api().patch(`${studio.quotesUrl}/${other.id}`).set(bearer(studio.owner.accessToken)).send({ version: 1, lines }).expect(200)
    expect(revised.body).toMatchObject({ status: 'draft', publicLinkActive: false, payUrl: null })
    await api().get(`/api/public/quotes/${tokenOf(other.publicUrl!)}`).expect(404)
  })

  it('shows a sent quote past its date as expired and refuses its acceptance', async () => {
    const sent = await sendQuote(studio, (await createQuote(studio)).id, uniqueEmail('late'))
    await backdateExpiry(sent.id)
    const token = tokenOf(sent.publicUrl!)
    expect((await api().get(`/api/public/quotes/${token}`).expect(200)).body).toMatchObject({ status: 'expired', canRespond: false, canPay: false })
    await api().post(`/api/public/quotes/${token}/accept`).expect(409)
    const detail = quoteDetailSchema.parse((await api().get(`${studio.quotesUrl}/${sent.id}`).set(bearer(studio.owner.accessToken)).expect(200)).body)
    expect(detail.status).toBe('expired')
  })
})
