import { roles, type Role } from '../../../shared/schemas/index'

const labels: Record<Role, string> = { owner: 'Owner', maker: 'Maker', viewer: 'Viewer' }

const descriptions: Record<Role, string> = {
  owner: 'Runs the workspace: everything a maker does, plus members and invites.',
  maker: 'Uploads designs, records stock, builds layouts and logs cuts.',
  viewer: 'Sees everything in the workspace; changes nothing.',
}

export function roleLabel(role: Role): string {
  return labels[role]
}

export function roleDescription(role: Role): string {
  return descriptions[role]
}

/** Options for role pickers, most powerful first. */
export const roleOptions = roles.map((role) => ({ value: role, label: labels[role], description: descriptions[role] }))

/** Chip colours: owners stand out, viewers stay quiet. */
export function roleColor(role: Role): string {
  return role === 'owner' ? 'primary' : role === 'maker' ? 'secondary' : 'grey-7'
}
