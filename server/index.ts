import { loadConfig } from './config.js'
import { createApp } from './app.js'
import { startRuntime } from './runtime.js'

const config = loadConfig()
const runtime = await startRuntime(config)
const app = createApp(runtime.context)
const server = app.listen(config.port, config.host, () => {
  runtime.context.logger.info({ url: config.appUrl }, 'Sheetsmith is listening')
})
server.on('error', (error) => {
  runtime.context.logger.fatal({ err: error }, 'the HTTP server could not start')
  process.exit(1)
})

let stopping = false
async function stop(signal: string) {
  if (stopping) return
  stopping = true
  runtime.context.logger.info({ signal }, 'stopping')
  server.close()
  await runtime.close().catch(() => {})
  process.exit(0)
}
process.on('SIGINT', () => void stop('SIGINT'))
process.on('SIGTERM', () => void stop('SIGTERM'))
