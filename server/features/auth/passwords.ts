import argon2 from 'argon2'

/** argon2id with the library's defaults (64 MiB, 3 passes), the OWASP-recommended family for password storage. */
export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, { type: argon2.argon2id })
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await argon2.verify(passwordHash, password)
  } catch {
    return false
  }
}

let decoyHash: Promise<string> | undefined
/** Verifying against a decoy when no account exists keeps sign-in timing the same either way. */
export async function verifyDecoy(password: string): Promise<false> {
  decoyHash ??= hashPassword('decoy-password-that-never-matches')
  await verifyPassword(await decoyHash, password)
  return false
}
