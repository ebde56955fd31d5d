import Stripe from 'stripe'
import type { PaymentsConfig } from '../../config.js'

/** A hosted checkout for one amount: where the customer pays, and the provider's id for it. */
export interface CheckoutSession {
  id: string
  url: string
  status: 'open' | 'complete' | 'expired'
}

export interface CheckoutRequest {
  amountMinor: number
  currency: string
  /** The one line the customer sees on the pay page. */
  description: string
  customerEmail: string | null
  successUrl: string
  cancelUrl: string
  metadata: Record<string, string>
}

/** A completed payment as the provider's signed event reports it. */
export interface CompletedCheckout {
  eventId: string
  sessionId: string
  amountMinor: number
  currency: string
  paid: boolean
  metadata: Record<string, string>
}

/** Pay links and their events, through the provider's official SDK; the rest of the app sees only this. */
export interface PaymentProvider {
  createCheckout: (request: CheckoutRequest) => Promise<CheckoutSession>
  retrieveCheckout: (sessionId: string) => Promise<CheckoutSession>
  /** Closes an open checkout (its quote changed); a session already closed is left as it is. */
  expireCheckout: (sessionId: string) => Promise<void>
  /**
   * Checks the signature of a webhook body against the endpoint secret and reads it. Throws on a bad or missing
   * signature. Returns the completed checkout, or null for events this app does not act on.
   */
  readWebhook: (rawBody: Buffer, signature: string) => CompletedCheckout | null
}

function sdkOptions(config: PaymentsConfig): ConstructorParameters<typeof Stripe>[1] {
  if (!config.apiUrl) return { maxNetworkRetries: 2, timeout: 20_000 }
  const url = new URL(config.apiUrl)
  return {
    host: url.hostname,
    port: url.port || (url.protocol === 'https:' ? 443 : 80),
    protocol: url.protocol === 'https:' ? 'https' : 'http',
    maxNetworkRetries: 0,
    timeout: 10_000,
    telemetry: false,
  }
}

function sessionOf(session: Stripe.Checkout.Session): CheckoutSession {
  return { id: session.id, url: session.url ?? '', status: (session.status ?? 'open') as CheckoutSession['status'] }
}

export function createPaymentProvider(config: PaymentsConfig): PaymentProvider | undefined {
  if (config.mode === 'off') return undefined
  const sdk = new Stripe(config.secretKey, sdkOptions(config))
  return {
    createCheckout: async (request) => {
      const session = await sdk.checkout.sessions.create({
        mode: 'payment',
        line_items: [
          {
            quantity: 1,
            price_data: { currency: request.currency.toLowerCase(), unit_amount: request.amountMinor, product_data: { name: request.description } },
          },
        ],
        ...(request.customerEmail ? { customer_email: request.customerEmail } : {}),
        success_url: request.successUrl,
        cancel_url: request.cancelUrl,
        metadata: request.metadata,
      })
      return sessionOf(session)
    },
    retrieveCheckout: async (sessionId) => sessionOf(await sdk.checkout.sessions.retrieve(sessionId)),
    expireCheckout: async (sessionId) => {
      const session = await sdk.checkout.sessions.retrieve(sessionId)
      if (session.status === 'open') await sdk.checkout.sessions.expire(sessionId)
    },
    readWebhook: (rawBody, signature) => {
      const event = sdk.webhooks.constructEvent(rawBody, signature, config.webhookSecret)
      if (event.type !== 'checkout.session.completed' && event.type !== 'checkout.session.async_payment_succeeded') return null
      const session = event.data.object
      return {
        eventId: event.id,
        sessionId: session.id,
        amountMinor: session.amount_total ?? 0,
        currency: (session.currency ?? '').toUpperCase(),
        paid: session.payment_status === 'paid',
        metadata: Object.fromEntries(Object.entries(session.metadata ?? {}).map(([key, value]) => [key, String(value)])),
      }
    },
  }
}
