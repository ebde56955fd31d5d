import { pino, type Logger } from 'pino'

export type { Logger }

export function createLogger(level: string): Logger {
  return pino({ level, base: { service: 'sheetsmith' }, redact: ['req.headers.authorization', 'req.headers.cookie', 'res.headers["set-cookie"]'] })
}
