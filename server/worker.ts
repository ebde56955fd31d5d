import { loadConfig } from './config.js'
import { startRuntime } from './runtime.js'

// A worker-only process: it works the job queue (mail now, nest runs later) and serves no HTTP.
// Start as many as the machines allow, all pointed at the same DATABASE_URL.
const config = { ...loadConfig(), runJobs: true }
const runtime = await startRuntime(config, { withMailCatcher: false })
runtime.context.logger.info('worker started; waiting for jobs')

async function stop() {
  await runtime.close().catch(() => {})
  process.exit(0)
}
process.on('SIGINT', () => void stop())
process.on('SIGTERM', () => void stop())
