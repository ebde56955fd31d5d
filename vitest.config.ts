import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vitest/config'

export default defineConfig({
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('./src', import.meta.url)),
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
    },
  },
  test: {
    include: ['tests/**/*.test.ts'],
    // One real server (API + built client + mail catcher + job workers) for the whole run, on the test database.
    globalSetup: ['tests/setup/globalServer.ts'],
    setupFiles: ['tests/setup/workerEnvironment.ts'],
    environment: 'node',
    pool: 'forks',
    maxWorkers: 2,
    // Browser tests share two cores with the server and another test file; several take 20–50 s on a busy run, so the
    // limit leaves room for a slower machine rather than failing on load.
    testTimeout: 90_000,
    hookTimeout: 60_000,
    // expect.poll gives up after 1 s by default: too short for a page reload (session refresh, then its requests)
    // while the other test file keeps both cores busy.
    expect: { poll: { timeout: 15_000, interval: 100 } },
    reporters: ['default'],
  },
})
