import { describe, expect, it } from 'vitest'
import type { Request } from 'express'
import { parseRequest } from '../../server/middleware/parseRequest.js'
import { AppError } from '../../server/errors.js'
import { signUpRequestSchema } from '../../shared/schemas/auth.js'
import { memberParamsSchema } from '../../shared/schemas/workspaces.js'

const fakeRequest = (parts: Partial<Request>) => parts as Request

describe('parseRequest', () => {
  it('returns parsed and normalised values', () => {
    const { body } = parseRequest(fakeRequest({ body: { name: ' Nell ', email: ' Nell@Studio.Example ', password: 'long-enough-1' } }), { body: signUpRequestSchema })
    expect(body).toEqual({ name: 'Nell', email: 'nell@studio.example', password: 'long-enough-1' })
  })

  it('names every bad field of every part in one error', () => {
    let caught: unknown
    try {
      parseRequest(fakeRequest({ body: { email: 'x' }, params: { workspaceId: 'nope', userId: 'nope' } }), { body: signUpRequestSchema, params: memberParamsSchema })
    } catch (error) {
      caught = error
    }
    expect(caught).toBeInstanceOf(AppError)
    const appError = caught as AppError
    expect(appError.status).toBe(400)
    expect(Object.keys(appError.fields!).sort()).toEqual(['body.email', 'body.name', 'body.password', 'params.userId', 'params.workspaceId'])
  })
})
