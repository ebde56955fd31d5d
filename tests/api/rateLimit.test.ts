import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import type { Express } from 'express'
import { loadConfig } from '../../server/config.js'
import { createApp } from '../../server/app.js'
import { startRuntime, type Runtime } from '../../server/runtime.js'

describe('rate limiting of sign-in, sign-up and reset', () => {
  let runtime: Runtime
  let app: Express

  beforeAll(async () => {
    // An app of its own with a small limit, so the shared test server keeps its generous one.
    runtime = await startRuntime({ ...loadConfig(), authRateLimit: 3 }, { withQueue: false, withMailCatcher: false })
    app = createApp(runtime.context)
  })
  afterAll(() => runtime.close())

  it('answers 429 in the error shape once an address has used its attempts', async () => {
    const attempt = () => request(app).post('/api/auth/signin').send({ email: 'someone@studio.example', password: 'guessing-again-1' })
    for (let index = 0; index < 3; index++) expect((await attempt()).status).toBe(401)
    const limited = await attempt()
    expect(limited.status).toBe(429)
    expect(limited.body.error.code).toBe('rate_limited')
  })

  it('does not limit ordinary reads', async () => {
    for (let index = 0; index < 5; index++) await request(app).get('/api/health').expect(200)
  })
})
