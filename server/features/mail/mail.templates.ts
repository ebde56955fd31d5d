import type { MailMessage } from './mail.repo.js'

const signature = '\n\n— Sheetsmith, for your cutting studio'

export function inviteMail(input: { to: string; workspaceName: string; invitedByName: string; role: string; link: string; expiresAt: Date }): MailMessage {
  return {
    kind: 'invite',
    to: input.to,
    subject: `${input.invitedByName} invited you to ${input.workspaceName} on Sheetsmith`,
    text:
      `${input.invitedByName} invited you to join the workspace "${input.workspaceName}" as ${input.role}.\n\n` +
      `Open this link to accept:\n${input.link}\n\n` +
      `The link works until ${input.expiresAt.toUTCString()}. If you did not expect this, ignore this message.` +
      signature,
  }
}

export function passwordResetMail(input: { to: string; name: string; link: string; expiresAt: Date }): MailMessage {
  return {
    kind: 'password-reset',
    to: input.to,
    subject: 'Reset your Sheetsmith password',
    text:
      `Hello ${input.name},\n\nSomeone (we hope you) asked to reset the password of this account.\n\n` +
      `Choose a new password here:\n${input.link}\n\n` +
      `The link works once, until ${input.expiresAt.toUTCString()}. If you did not ask, ignore this message; your password stays as it is.` +
      signature,
  }
}
