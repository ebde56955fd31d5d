import type { QuoteStatus } from '../../../shared/schemas/quotes'
import { formatMinor } from '../../../shared/quotes/money'

/** "84.72 EUR": the amount with the currency's own digits and its code (no symbol guessing). */
export function money(amountMinor: number, currency: string): string {
  return `${formatMinor(amountMinor, currency)} ${currency}`
}

export const statusLabels: Record<QuoteStatus, string> = {
  draft: 'Draft',
  sent: 'Sent',
  accepted: 'Accepted',
  declined: 'Declined',
  expired: 'Expired',
  paid: 'Paid',
}

export const statusColours: Record<QuoteStatus, string> = {
  draft: 'grey-6',
  sent: 'blue-7',
  accepted: 'teal-7',
  declined: 'deep-orange-7',
  expired: 'brown-5',
  paid: 'positive',
}
