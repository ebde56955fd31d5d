import { describe, expect, it } from 'vitest'
import jwt from 'jsonwebtoken'
import { loadConfig } from '../../server/config.js'
import { ageRefreshRotations } from './dbFixtures.js'
import { api, bearer, refreshCookieFrom, signIn, signUp, testPassword, tokenFromLink, uniqueEmail, waitForMail } from './helpers.js'

const config = loadConfig()

describe('sign-up, sign-in and sign-out', () => {
  it('signs up a person as owner of a new workspace and returns a session', async () => {
    const email = uniqueEmail('new')
    const response = await api().post('/api/auth/signup').send({ name: 'Nell Brook', email, password: testPassword })
    expect(response.status).toBe(201)
    expect(response.body.user).toMatchObject({ email, name: 'Nell Brook', unitSystem: 'mm' })
    expect(response.headers['set-cookie']?.[0]).toMatch(/sheetsmith_refresh=.+; Path=\/api\/auth; Expires=.+; HttpOnly; SameSite=Strict/)

    const workspaces = await api().get('/api/workspaces').set(bearer(response.body.accessToken))
    expect(workspaces.body).toEqual([expect.objectContaining({ name: "Nell Brook's studio", role: 'owner', memberCount: 1 })])
  })

  it('stores the e-mail lower-cased and refuses a second account for it', async () => {
    const email = uniqueEmail('case')
    await api().post('/api/auth/signup').send({ name: 'A', email: email.toUpperCase(), password: testPassword }).expect(201)
    const again = await api().post('/api/auth/signup').send({ name: 'B', email, password: testPassword })
    expect(again.status).toBe(409)
    expect(again.body.error.fields).toHaveProperty(['body.email'])
  })

  it('answers bad bodies with 400 naming every bad field', async () => {
    const response = await api().post('/api/auth/signup').send({ name: '', email: 'not-an-address', password: 'short' })
    expect(response.status).toBe(400)
    expect(response.body.error.code).toBe('validation_failed')
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['body.email', 'body.name', 'body.password'])

    const notJson = await api().post('/api/auth/signin').set('Content-Type', 'application/json').send('{"email":')
    expect(notJson.status).toBe(400)
    expect(notJson.body.error.message).toMatch(/not valid JSON/)
  })

  it('gives the same answer for an unknown e-mail and a wrong password', async () => {
    const person = await signUp('secretive')
    const wrongPassword = await api().post('/api/auth/signin').send({ email: person.email, password: 'wrong-password-123' })
    const unknownEmail = await api().post('/api/auth/signin').send({ email: uniqueEmail('nobody'), password: 'wrong-password-123' })
    expect(wrongPassword.status).toBe(401)
    expect(unknownEmail.status).toBe(401)
    expect(unknownEmail.body).toEqual(wrongPassword.body)
  })

  it('signs in and out; a signed-out refresh token no longer works', async () => {
    const person = await signUp('inout')
    const session = await signIn(person.email)
    const me = await api().get('/api/me').set(bearer(session.accessToken))
    expect(me.body.email).toBe(person.email)

    await api().post('/api/auth/signout').set('Cookie', session.refreshCookie).expect(204)
    const refreshed = await api().post('/api/auth/refresh').set('Cookie', session.refreshCookie)
    expect(refreshed.status).toBe(401)
  })
})

describe('tokens', () => {
  it('rotates the refresh token on use and rejects the old one', async () => {
    const person = await signUp('rotate')
    const first = await api().post('/api/auth/refresh').set('Cookie', person.refreshCookie)
    expect(first.status).toBe(200)
    const rotatedCookie = refreshCookieFrom(first)
    expect(rotatedCookie).not.toBe(person.refreshCookie)

    await ageRefreshRotations(person.user.id, 60)
    const replay = await api().post('/api/auth/refresh').set('Cookie', person.refreshCookie)
    expect(replay.status).toBe(401)
    // A replayed token means it leaked: the whole family, including the newest token, is revoked.
    const afterReplay = await api().post('/api/auth/refresh').set('Cookie', rotatedCookie)
    expect(afterReplay.status).toBe(401)
  })

  it('gives a second tab that refreshes with the just-rotated token a session too, without revoking anything', async () => {
    const person = await signUp('two-tabs')
    // The second tab sends the token the first has just rotated (it has not seen the new cookie yet).
    const first = await api().post('/api/auth/refresh').set('Cookie', person.refreshCookie)
    const second = await api().post('/api/auth/refresh').set('Cookie', person.refreshCookie)
    expect([first.status, second.status]).toEqual([200, 200])
    expect((await api().post('/api/auth/refresh').set('Cookie', refreshCookieFrom(first))).status).toBe(200)
    const again = await api().post('/api/auth/refresh').set('Cookie', refreshCookieFrom(second))
    expect(again.status).toBe(200)
  })

  it('answers a refresh without any cookie with 204 (nothing to resume), not a session', async () => {
    const response = await api().post('/api/auth/refresh')
    expect(response.status).toBe(204)
    expect(response.headers['set-cookie']).toBeUndefined()
  })

  it('answers 401 for a missing, expired or tampered access token', async () => {
    const person = await signUp('tokens')
    await api().get('/api/me').expect(401)

    const expired = jwt.sign({}, config.jwtSecret, { subject: person.user.id, expiresIn: -10, issuer: 'sheetsmith', audience: 'sheetsmith-api' })
    const expiredAnswer = await api().get('/api/me').set(bearer(expired))
    expect(expiredAnswer.status).toBe(401)
    expect(expiredAnswer.body.error.code).toBe('unauthenticated')

    const [header, payload, signature] = person.accessToken.split('.')
    const otherUser = Buffer.from(JSON.stringify({ ...JSON.parse(Buffer.from(payload!, 'base64url').toString()), sub: '00000000-0000-4000-8000-000000000000' })).toString('base64url')
    await api().get('/api/me').set(bearer(`${header}.${otherUser}.${signature}`)).expect(401)

    const foreignSecret = jwt.sign({}, 'another-secret-of-enough-length-0123456789', { subject: person.user.id, expiresIn: 60, issuer: 'sheetsmith', audience: 'sheetsmith-api' })
    await api().get('/api/me').set(bearer(foreignSecret)).expect(401)
  })
})

describe('password reset by e-mail', () => {
  it('mails a link; the new password works, the old one does not, and the link works once', async () => {
    const person = await signUp('forgetful')
    const answer = await api().post('/api/auth/password-reset').send({ email: person.email })
    expect(answer.status).toBe(202)
    const mail = await waitForMail(person.email, 'Reset your Sheetsmith password')
    const link = mail.links.find((candidate) => candidate.includes('/reset-password?token='))!
    expect(link.startsWith(config.appUrl)).toBe(true)
    const token = tokenFromLink(link)

    const newPassword = 'a-brand-new-password-77'
    await api().post('/api/auth/password-reset/confirm').send({ token, password: newPassword }).expect(204)
    await api().post('/api/auth/signin').send({ email: person.email, password: testPassword }).expect(401)
    await signIn(person.email, newPassword)

    const reused = await api().post('/api/auth/password-reset/confirm').send({ token, password: 'yet-another-password-88' })
    expect(reused.status).toBe(400)
    expect(reused.body.error.fields).toHaveProperty(['body.token'])
    // The reset ended the sessions that existed before it.
    await api().post('/api/auth/refresh').set('Cookie', person.refreshCookie).expect(401)
  })

  it('answers 202 for an unknown e-mail too, and sends nothing', async () => {
    const email = uniqueEmail('ghost')
    await api().post('/api/auth/password-reset').send({ email }).expect(202)
    const outbox = await api().get('/api/dev/outbox')
    expect(outbox.body.some((message: { to: string }) => message.to.includes(email))).toBe(false)
  })
})

describe('the signed-in person', () => {
  it('keeps a unit preference and refuses an unknown unit', async () => {
    const person = await signUp('units')
    const changed = await api().patch('/api/me').set(bearer(person.accessToken)).send({ unitSystem: 'in' })
    expect(changed.body.unitSystem).toBe('in')
    const bad = await api().patch('/api/me').set(bearer(person.accessToken)).send({ unitSystem: 'furlong' })
    expect(bad.status).toBe(400)
    expect(bad.body.error.fields).toHaveProperty(['body.unitSystem'])
    const me = await api().get('/api/me').set(bearer(person.accessToken))
    expect(me.body.unitSystem).toBe('in')
  })

  it('changes the password, ending older sessions but keeping this one', async () => {
    const person = await signUp('changer')
    await new Promise((resolve) => setTimeout(resolve, 1100)) // access tokens carry whole-second issue times
    const wrong = await api().post('/api/me/password').set(bearer(person.accessToken)).send({ currentPassword: 'nope-nope-nope', newPassword: 'fresh-password-2026' })
    expect(wrong.status).toBe(400)
    expect(wrong.body.error.fields).toHaveProperty(['body.currentPassword'])

    const changed = await api().post('/api/me/password').set(bearer(person.accessToken)).send({ currentPassword: testPassword, newPassword: 'fresh-password-2026' })
    expect(changed.status).toBe(200)
    await api().get('/api/me').set(bearer(person.accessToken)).expect(401)
    await api().get('/api/me').set(bearer(changed.body.accessToken)).expect(200)
    await api().post('/api/auth/refresh').set('Cookie', person.refreshCookie).expect(401)
  })
})

describe('health', () => {
  it('reports the database as reachable', async () => {
    const response = await api().get('/api/health')
    expect(response.body).toMatchObject({ status: 'ok', database: 'up' })
  })

  it('answers an unknown API route with the JSON error shape', async () => {
    const response = await api().get('/api/no-such-thing')
    expect(response.status).toBe(404)
    expect(response.body.error.code).toBe('not_found')
  })
})
