import type { RequestHandler } from 'express'
import type { Role } from '../../shared/schemas/workspaces.js'
import { workspaceParamsSchema } from '../../shared/schemas/workspaces.js'
import type { Database } from '../db/client.js'
import { forbidden, notFound } from '../errors.js'
import { findMembership } from '../features/workspaces/workspaces.repo.js'
import { parseRequest } from './parseRequest.js'

const roleRank: Record<Role, number> = { viewer: 1, maker: 2, owner: 3 }

export function roleAtLeast(role: Role, minimum: Role): boolean {
  return roleRank[role] >= roleRank[minimum]
}

export interface WorkspaceAccess {
  workspaceId: string
  role: Role
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      workspaceAccess?: WorkspaceAccess
    }
  }
}

/**
 * Checks that the signed-in user belongs to `:workspaceId` with at least `minimum` role.
 * A non-member gets 404 (the workspace's existence is not revealed); a member with too small a role gets 403.
 */
export function requireWorkspaceRole(db: Database, minimum: Role): RequestHandler {
  return async (request, _response, next) => {
    const { params } = parseRequest(request, { params: workspaceParamsSchema.loose() })
    const membership = await findMembership(db, params.workspaceId, request.user!.id)
    if (!membership) throw notFound('Workspace')
    if (!roleAtLeast(membership.role, minimum)) throw forbidden()
    request.workspaceAccess = { workspaceId: params.workspaceId, role: membership.role }
    next()
  }
}
