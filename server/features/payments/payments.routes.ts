import express, { Router } from 'express'
import type { AppContext } from '../../context.js'
import { AppError, notFound } from '../../errors.js'
import { recordPayment } from '../quotes/quotes.service.js'

/**
 * `/api/payments/webhook`: events from the payment provider. The signature is checked over the exact bytes received,
 * so this route reads the raw body itself and is mounted before the JSON parser. A bad or missing signature → 400 and
 * nothing changes; an event this app does not act on, or one that changes nothing (repeated, stale), → 200 so the
 * provider stops resending it.
 */
export function paymentWebhookRoutes(context: AppContext): Router {
  const router = Router()
  router.post('/webhook', express.raw({ type: () => true, limit: '512kb' }), async (request, response) => {
    if (!context.payments) throw notFound('Payments')
    const signature = request.headers['stripe-signature']
    if (typeof signature !== 'string' || signature === '') throw new AppError('validation_failed', 400, 'The payment event has no signature', { 'headers.stripe-signature': ['Missing'] })
    const body = Buffer.isBuffer(request.body) ? request.body : Buffer.alloc(0)
    let checkout
    try {
      checkout = context.payments.readWebhook(body, signature)
    } catch {
      throw new AppError('validation_failed', 400, 'The payment event signature does not match', { 'headers.stripe-signature': ['Does not match'] })
    }
    if (!checkout) return response.json({ received: true, applied: false })
    const result = await recordPayment(context, checkout)
    if (!result.applied) context.logger.warn({ sessionId: checkout.sessionId, reason: result.reason }, 'payment event not applied')
    response.json({ received: true, applied: result.applied })
  })
  return router
}
