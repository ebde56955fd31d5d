import nodemailer, { type Transporter } from 'nodemailer'
import type { AppConfig } from '../../config.js'

/** Real SMTP when SMTP_URL is set; otherwise the local mail catcher on loopback. */
export function createMailTransport(config: AppConfig): Transporter {
  if (config.smtpUrl) return nodemailer.createTransport(config.smtpUrl)
  return nodemailer.createTransport({
    host: '127.0.0.1',
    port: config.mailCatcherPort,
    secure: false,
    ignoreTLS: true,
    connectionTimeout: 5000,
  })
}
