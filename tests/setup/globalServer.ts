import type { Server } from 'node:http'
import type { TestProject } from 'vitest/node'
import { loadConfig } from '../../server/config.js'
import { createApp } from '../../server/app.js'
import { startRuntime } from '../../server/runtime.js'
import { applyTestEnvironment } from './testEnvironment.js'

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string
  }
}

/** Starts the whole server in-process once; API and end-to-end tests call it over HTTP. */
export default async function setup(project: TestProject) {
  applyTestEnvironment()
  const config = loadConfig()
  const runtime = await startRuntime(config)
  const app = createApp(runtime.context)
  const server: Server = await new Promise((resolve, reject) => {
    const listening = app.listen(config.port, config.host, () => resolve(listening))
    listening.once('error', reject)
  })
  project.provide('baseUrl', config.appUrl)
  return async () => {
    await new Promise<void>((resolve) => server.close(() => resolve()))
    await runtime.close()
  }
}
