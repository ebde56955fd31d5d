import type { MailMessage } from '../mail/mail.repo.js'

const signature = '\n\n— Sent with Sheetsmith'

export function quoteMail(input: {
  to: string
  customerName: string
  studioName: string
  number: number
  title: string
  total: string
  message: string
  link: string
  payUrl: string | null
  expiresAt: Date
  pdf: { filename: string; content: Buffer }
}): MailMessage {
  const greeting = input.customerName ? `Hello ${input.customerName},` : 'Hello,'
  const what = input.title ? `Quote ${input.number}: ${input.title}` : `Quote ${input.number}`
  return {
    kind: 'quote',
    to: input.to,
    subject: `${what} from ${input.studioName}`,
    text:
      `${greeting}\n\n` +
      (input.message ? `${input.message}\n\n` : '') +
      `${input.studioName} sent you a quote for ${input.total}. It is attached as a PDF.\n\n` +
      `See it online, and accept or decline it:\n${input.link}\n\n` +
      (input.payUrl ? `Pay it directly with this pay link:\n${input.payUrl}\n\n` : '') +
      `The quote is valid until ${input.expiresAt.toUTCString()}.` +
      signature,
    attachments: [{ filename: input.pdf.filename, contentType: 'application/pdf', content: input.pdf.content }],
  }
}
