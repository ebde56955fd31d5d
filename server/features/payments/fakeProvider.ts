import { randomBytes } from 'node:crypto'
import type { Server } from 'node:http'
import express from 'express'
import Stripe from 'stripe'
import type { Logger } from '../../logger.js'
import { fromMinor } from '../../../shared/quotes/money.js'

/**
 * A local stand-in for the payment provider's API, for development and tests: the SDK is pointed at it by
 * configuration, so the app runs exactly the code it runs against the real provider. It keeps checkout sessions in
 * memory, serves a plain pay page per session, and on "Pay" sends `checkout.session.completed` to the app's webhook,
 * signed the way the SDK verifies. No card data, no real money.
 */

interface FakeSession {
  id: string
  object: 'checkout.session'
  mode: string
  status: 'open' | 'complete' | 'expired'
  payment_status: 'unpaid' | 'paid'
  amount_total: number
  currency: string
  customer_email: string | null
  success_url: string
  cancel_url: string
  metadata: Record<string, string>
  url: string
  created: number
  livemode: false
  payment_intent: string | null
  description: string
}

export interface FakePaymentProvider {
  url: string
  close: () => Promise<void>
}

const escapeHtml = (text: string) => text.replace(/[&<>"']/g, (character) => `&#${character.charCodeAt(0)};`)
const id = (prefix: string) => `${prefix}_test_${randomBytes(12).toString('hex')}`

function apiError(response: express.Response, status: number, message: string, param?: string) {
  response.status(status).json({ error: { type: 'invalid_request_error', message, ...(param ? { param } : {}) } })
}

function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style>
body{font-family:system-ui,sans-serif;background:#eef0f2;color:#1d2428;margin:0;padding:48px 16px}
main{max-width:440px;margin:0 auto;background:#fff;border-radius:10px;padding:28px;box-shadow:0 2px 10px rgba(0,0,0,.08)}
.banner{background:#fff4d6;border:1px solid #e2c46a;border-radius:6px;padding:8px 12px;font-size:.9rem;margin-bottom:20px}
.amount{font-size:2rem;font-weight:700;margin:8px 0 4px}
.muted{color:#5d6668;font-size:.9rem}
button{background:#1f6f5c;color:#fff;border:0;border-radius:6px;padding:12px 20px;font-size:1rem;cursor:pointer;width:100%;margin-top:20px}
a.cancel{display:block;text-align:center;margin-top:14px;color:#5d6668}
</style></head><body><main>${body}</main></body></html>`
}

export async function startFakePaymentProvider(options: { port: number; webhookUrl: string; webhookSecret: string; logger: Logger }): Promise<FakePaymentProvider> {
  const baseUrl = `http://127.0.0.1:${options.port}`
  const sessions = new Map<string, FakeSession>()
  // Only used to sign events; the key is never sent anywhere.
  const signer = new Stripe('sk_test_sheetsmith_local_fake_signer')
  const app = express()
  app.disable('x-powered-by')
  app.use(express.urlencoded({ extended: true, limit: '256kb' }))

  app.post('/v1/checkout/sessions', (request, response) => {
    const body = request.body as Record<string, unknown>
    const items = (body.line_items ?? []) as { quantity?: string; price_data?: { currency?: string; unit_amount?: string; product_data?: { name?: string } } }[]
    if (!Array.isArray(items) || items.length === 0) return apiError(response, 400, 'Missing required param: line_items.', 'line_items')
    if (typeof body.success_url !== 'string') return apiError(response, 400, 'Missing required param: success_url.', 'success_url')
    const currencies = new Set(items.map((item) => item.price_data?.currency))
    if (currencies.size !== 1 || !/^[a-z]{3}$/.test([...currencies][0] ?? '')) return apiError(response, 400, 'Invalid currency.', 'line_items[0][price_data][currency]')
    let amount = 0
    for (const item of items) {
      const unitAmount = Number(item.price_data?.unit_amount)
      const quantity = Number(item.quantity ?? 1)
      if (!Number.isInteger(unitAmount) || unitAmount < 0 || !Number.isInteger(quantity) || quantity < 1) {
        return apiError(response, 400, 'Invalid integer: unit_amount and quantity must be whole numbers.', 'line_items')
      }
      amount += unitAmount * quantity
    }
    const sessionId = id('cs')
    const session: FakeSession = {
      id: sessionId,
      object: 'checkout.session',
      mode: String(body.mode ?? 'payment'),
      status: 'open',
      payment_status: 'unpaid',
      amount_total: amount,
      currency: [...currencies][0]!,
      customer_email: typeof body.customer_email === 'string' ? body.customer_email : null,
      success_url: body.success_url,
      cancel_url: typeof body.cancel_url === 'string' ? body.cancel_url : body.success_url,
      metadata: (body.metadata ?? {}) as Record<string, string>,
      url: `${baseUrl}/pay/${sessionId}`,
      created: Math.floor(Date.now() / 1000),
      livemode: false,
      payment_intent: null,
      description: items.map((item) => item.price_data?.product_data?.name ?? 'Payment').join(', '),
    }
    sessions.set(sessionId, session)
    response.json(session)
  })

  app.get('/v1/checkout/sessions/:sessionId', (request, response) => {
    const session = sessions.get(request.params.sessionId)
    if (!session) return apiError(response, 404, `No such checkout.session: '${request.params.sessionId}'`, 'id')
    response.json(session)
  })

  app.post('/v1/checkout/sessions/:sessionId/expire', (request, response) => {
    const session = sessions.get(request.params.sessionId)
    if (!session) return apiError(response, 404, `No such checkout.session: '${request.params.sessionId}'`, 'id')
    if (session.status !== 'open') return apiError(response, 400, 'Only Checkout Sessions with a status in ["open"] can be expired.')
    session.status = 'expired'
    response.json(session)
  })

  app.get('/pay/:sessionId', (request, response) => {
    const session = sessions.get(request.params.sessionId)
    if (!session) return response.status(404).send(page('Not found', '<h1>This pay link is not known</h1>'))
    const amount = new Intl.NumberFormat('en', { style: 'currency', currency: session.currency.toUpperCase() }).format(fromMinor(session.amount_total, session.currency))
    const state =
      session.status === 'open'
        ? `<form method="post" action="/pay/${escapeHtml(session.id)}/complete"><button type="submit" data-testid="fake-pay">Pay ${escapeHtml(amount)}</button></form>
<a class="cancel" href="${escapeHtml(session.cancel_url)}">Cancel and go back</a>`
        : `<p><strong>${session.status === 'complete' ? 'This payment is complete.' : 'This pay link has expired.'}</strong></p>`
    response.send(
      page(
        'Test payment',
        `<div class="banner">Test payment provider — no real money is taken.</div>
<div class="muted">${escapeHtml(session.description)}</div>
<div class="amount" data-testid="fake-amount">${escapeHtml(amount)}</div>
${session.customer_email ? `<div class="muted">for ${escapeHtml(session.customer_email)}</div>` : ''}
${state}`,
      ),
    )
  })

  app.post('/pay/:sessionId/complete', async (request, response) => {
    const session = sessions.get(request.params.sessionId)
    if (!session) return response.status(404).send(page('Not found', '<h1>This pay link is not known</h1>'))
    if (session.status !== 'open') return response.redirect(303, `/pay/${session.id}`)
    const completed: FakeSession = { ...session, status: 'complete', payment_status: 'paid', payment_intent: id('pi') }
    const payload = JSON.stringify({
      id: id('evt'),
      object: 'event',
      type: 'checkout.session.completed',
      created: Math.floor(Date.now() / 1000),
      livemode: false,
      pending_webhooks: 1,
      data: { object: completed },
    })
    const signature = signer.webhooks.generateTestHeaderString({ payload, secret: options.webhookSecret })
    try {
      const answer = await fetch(options.webhookUrl, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': signature }, body: payload })
      if (!answer.ok) throw new Error(`webhook answered ${answer.status}`)
    } catch (error) {
      options.logger.warn({ err: error, sessionId: session.id }, 'fake payment provider: the webhook failed')
      return response.status(502).send(page('Payment not recorded', '<h1>The shop did not accept the payment notice</h1><p class="muted">Nothing was charged. Try again.</p>'))
    }
    sessions.set(session.id, completed)
    response.redirect(303, session.success_url.replace('{CHECKOUT_SESSION_ID}', session.id))
  })

  const server: Server = await new Promise((resolve, reject) => {
    const listening = app.listen(options.port, '127.0.0.1', () => resolve(listening))
    listening.once('error', reject)
  })
  options.logger.info({ port: options.port }, 'fake payment provider listening')
  return { url: baseUrl, close: () => new Promise<void>((resolve) => server.close(() => resolve())) }
}
