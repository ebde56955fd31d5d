import { beforeAll, describe, expect, it } from 'vitest'
import { addMember, api, bearer, signIn, signUp, testPassword, tokenFromLink, uniqueEmail, waitForMail, type SignedUpUser } from './helpers.js'
import { insertBystander } from './dbFixtures.js'

type Actor = 'owner' | 'maker' | 'viewer' | 'outsider'
const actors: Actor[] = ['owner', 'maker', 'viewer', 'outsider']

describe('role matrix: every workspace route as owner, maker, viewer and a member of another workspace', () => {
  let owner: SignedUpUser
  const tokens = {} as Record<Actor, string>
  let workspaceId: string

  beforeAll(async () => {
    owner = await signUp('matrix-owner')
    workspaceId = owner.workspace.id
    tokens.owner = owner.accessToken
    tokens.maker = (await addMember(owner, 'maker')).accessToken
    tokens.viewer = (await addMember(owner, 'viewer')).accessToken
    tokens.outsider = (await signUp('matrix-outsider')).accessToken
  })

  // Each call arranges its own target, so the calls do not depend on one another's effects.
  const routes: { name: string; expected: Record<Actor, number>; call: (token: string) => Promise<{ status: number }> }[] = [
    { name: 'GET workspace', expected: { owner: 200, maker: 200, viewer: 200, outsider: 404 }, call: (token) => api().get(`/api/workspaces/${workspaceId}`).set(bearer(token)) },
    {
      name: 'PATCH workspace',
      expected: { owner: 200, maker: 403, viewer: 403, outsider: 404 },
      call: (token) => api().patch(`/api/workspaces/${workspaceId}`).set(bearer(token)).send({ name: 'Matrix bench' }),
    },
    { name: 'GET members', expected: { owner: 200, maker: 200, viewer: 200, outsider: 404 }, call: (token) => api().get(`/api/workspaces/${workspaceId}/members`).set(bearer(token)) },
    {
      name: 'POST members',
      expected: { owner: 201, maker: 403, viewer: 403, outsider: 404 },
      call: (token) => api().post(`/api/workspaces/${workspaceId}/members`).set(bearer(token)).send({ email: uniqueEmail('matrix'), role: 'viewer' }),
    },
    {
      name: 'PATCH member',
      expected: { owner: 200, maker: 403, viewer: 403, outsider: 404 },
      call: async (token) => {
        const target = await insertBystander(workspaceId, 'viewer')
        return api().patch(`/api/workspaces/${workspaceId}/members/${target.id}`).set(bearer(token)).send({ role: 'maker' })
      },
    },
    {
      name: 'DELETE another member',
      expected: { owner: 204, maker: 403, viewer: 403, outsider: 404 },
      call: async (token) => {
        const target = await insertBystander(workspaceId, 'viewer')
        return api().delete(`/api/workspaces/${workspaceId}/members/${target.id}`).set(bearer(token))
      },
    },
    { name: 'GET invites', expected: { owner: 200, maker: 403, viewer: 403, outsider: 404 }, call: (token) => api().get(`/api/workspaces/${workspaceId}/invites`).set(bearer(token)) },
    {
      name: 'POST invites',
      expected: { owner: 201, maker: 403, viewer: 403, outsider: 404 },
      call: (token) => api().post(`/api/workspaces/${workspaceId}/invites`).set(bearer(token)).send({ email: uniqueEmail('matrix'), role: 'maker' }),
    },
    {
      name: 'DELETE invite',
      expected: { owner: 204, maker: 403, viewer: 403, outsider: 404 },
      call: async (token) => {
        const invite = await api().post(`/api/workspaces/${workspaceId}/invites`).set(bearer(tokens.owner)).send({ email: uniqueEmail('revoke'), role: 'viewer' })
        return api().delete(`/api/workspaces/${workspaceId}/invites/${invite.body.id}`).set(bearer(token))
      },
    },
  ]

  for (const route of routes) {
    for (const actor of actors) {
      it(`${route.name} as ${actor} → ${route.expected[actor]}`, async () => {
        const response = await route.call(tokens[actor])
        expect(response.status).toBe(route.expected[actor])
      })
    }
  }

  it('answers 404 for a workspace that does not exist and 400 for an id that is not one', async () => {
    await api().get('/api/workspaces/00000000-0000-4000-8000-000000000000/members').set(bearer(tokens.owner)).expect(404)
    const malformed = await api().get('/api/workspaces/not-a-uuid/members').set(bearer(tokens.owner))
    expect(malformed.status).toBe(400)
    expect(malformed.body.error.fields).toHaveProperty(['params.workspaceId'])
  })

  it('lets a maker and a viewer read the members but not see another workspace in their list', async () => {
    const list = await api().get('/api/workspaces').set(bearer(tokens.viewer))
    expect(list.body.map((workspace: { id: string }) => workspace.id)).toEqual([workspaceId])
  })
})

describe('invites', () => {
  it('invites by e-mail; the invitee sets a password from the link, signs in and sees the workspace', async () => {
    const owner = await signUp('inviter')
    const email = uniqueEmail('invitee')
    const created = await api().post(`/api/workspaces/${owner.workspace.id}/invites`).set(bearer(owner.accessToken)).send({ email, role: 'maker' })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ email, role: 'maker' })

    const mail = await waitForMail(email, 'invited you')
    const token = tokenFromLink(mail.links[0]!)
    const preview = await api().get(`/api/invites/${token}`)
    expect(preview.body).toMatchObject({ workspaceName: 'inviter bench', email, role: 'maker', accountExists: false })

    const missing = await api().post(`/api/invites/${token}/accept`).send({})
    expect(missing.status).toBe(400)
    expect(Object.keys(missing.body.error.fields).sort()).toEqual(['body.name', 'body.password'])

    await api().post(`/api/invites/${token}/accept`).send({ name: 'Ines Loom', password: testPassword }).expect(200)
    const session = await signIn(email)
    const workspaces = await api().get('/api/workspaces').set(bearer(session.accessToken))
    expect(workspaces.body).toEqual([expect.objectContaining({ id: owner.workspace.id, role: 'maker', memberCount: 2 })])

    // The link works once.
    await api().get(`/api/invites/${token}`).expect(404)
    await api().post(`/api/invites/${token}/accept`).send({ name: 'Again', password: testPassword }).expect(404)
  })

  it('asks an existing account to sign in as the invited e-mail, then switches between both workspaces', async () => {
    const owner = await signUp('host')
    const guest = await signUp('guest')
    await api().post(`/api/workspaces/${owner.workspace.id}/invites`).set(bearer(owner.accessToken)).send({ email: guest.email, role: 'viewer' }).expect(201)
    const token = tokenFromLink((await waitForMail(guest.email, 'invited you')).links[0]!)

    expect((await api().get(`/api/invites/${token}`)).body.accountExists).toBe(true)
    await api().post(`/api/invites/${token}/accept`).send({}).expect(401)
    const stranger = await signUp('stranger')
    await api().post(`/api/invites/${token}/accept`).set(bearer(stranger.accessToken)).send({}).expect(403)
    const accepted = await api().post(`/api/invites/${token}/accept`).set(bearer(guest.accessToken)).send({})
    expect(accepted.body).toMatchObject({ workspaceId: owner.workspace.id, role: 'viewer' })

    const list = await api().get('/api/workspaces').set(bearer(guest.accessToken))
    expect(list.body.map((workspace: { role: string }) => workspace.role).sort()).toEqual(['owner', 'viewer'])
    // Switching is choosing which workspace's routes to call: both answer for this person.
    for (const workspace of list.body) await api().get(`/api/workspaces/${workspace.id}/members`).set(bearer(guest.accessToken)).expect(200)
  })

  it('refuses to invite someone who is already a member, and replaces an older open invite', async () => {
    const owner = await signUp('dupes')
    const again = await api().post(`/api/workspaces/${owner.workspace.id}/invites`).set(bearer(owner.accessToken)).send({ email: owner.email, role: 'maker' })
    expect(again.status).toBe(409)

    const email = uniqueEmail('twice')
    await api().post(`/api/workspaces/${owner.workspace.id}/invites`).set(bearer(owner.accessToken)).send({ email, role: 'viewer' }).expect(201)
    await api().post(`/api/workspaces/${owner.workspace.id}/invites`).set(bearer(owner.accessToken)).send({ email, role: 'maker' }).expect(201)
    const open = await api().get(`/api/workspaces/${owner.workspace.id}/invites`).set(bearer(owner.accessToken))
    expect(open.body).toEqual([expect.objectContaining({ email, role: 'maker' })])
  })

  it('rejects an invite with a bad role or e-mail, naming the fields', async () => {
    const owner = await signUp('badinvite')
    const response = await api().post(`/api/workspaces/${owner.workspace.id}/invites`).set(bearer(owner.accessToken)).send({ email: 'nope', role: 'admin' })
    expect(response.status).toBe(400)
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['body.email', 'body.role'])
  })
})

describe('members', () => {
  it('changes a role and removes a member; the last owner can be neither demoted nor removed', async () => {
    const owner = await signUp('boss')
    const maker = await addMember(owner, 'maker')
    const url = `/api/workspaces/${owner.workspace.id}/members`

    const promoted = await api().patch(`${url}/${maker.userId}`).set(bearer(owner.accessToken)).send({ role: 'viewer' })
    expect(promoted.body).toMatchObject({ userId: maker.userId, role: 'viewer' })

    const demoteSelf = await api().patch(`${url}/${owner.user.id}`).set(bearer(owner.accessToken)).send({ role: 'maker' })
    expect(demoteSelf.status).toBe(409)
    expect(demoteSelf.body.error.message).toMatch(/at least one owner/)
    await api().delete(`${url}/${owner.user.id}`).set(bearer(owner.accessToken)).expect(409)

    await api().delete(`${url}/${maker.userId}`).set(bearer(owner.accessToken)).expect(204)
    const members = await api().get(url).set(bearer(owner.accessToken))
    expect(members.body.map((member: { email: string }) => member.email)).toEqual([owner.email])
    // The removed person's access to the workspace is gone at once.
    await api().get(url).set(bearer(maker.accessToken)).expect(404)
  })

  it('lets a second owner take over, after which the first may leave', async () => {
    const owner = await signUp('founder')
    const partner = await addMember(owner, 'owner', 'partner')
    const url = `/api/workspaces/${owner.workspace.id}/members`
    await api().patch(`${url}/${owner.user.id}`).set(bearer(owner.accessToken)).send({ role: 'maker' }).expect(200)
    await api().delete(`${url}/${owner.user.id}`).set(bearer(owner.accessToken)).expect(204)
    const members = await api().get(url).set(bearer(partner.accessToken))
    expect(members.body).toEqual([expect.objectContaining({ userId: partner.userId, role: 'owner' })])
  })

  it('lets a viewer leave a workspace but not remove others', async () => {
    const owner = await signUp('leaver-host')
    const viewer = await addMember(owner, 'viewer')
    const url = `/api/workspaces/${owner.workspace.id}/members`
    await api().delete(`${url}/${owner.user.id}`).set(bearer(viewer.accessToken)).expect(403)
    await api().delete(`${url}/${viewer.userId}`).set(bearer(viewer.accessToken)).expect(204)
    const list = await api().get('/api/workspaces').set(bearer(viewer.accessToken))
    expect(list.body).toEqual([])
  })

  it('creates a further workspace for a person, who owns it', async () => {
    const person = await signUp('multi')
    const created = await api().post('/api/workspaces').set(bearer(person.accessToken)).send({ name: 'Second bench' })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ name: 'Second bench', role: 'owner', memberCount: 1 })
    const blank = await api().post('/api/workspaces').set(bearer(person.accessToken)).send({ name: '  ' })
    expect(blank.status).toBe(400)
    expect(blank.body.error.fields).toHaveProperty(['body.name'])
  })
})
