import { createHash, randomBytes } from 'node:crypto'
import jwt from 'jsonwebtoken'

export const tokenIssuer = 'sheetsmith'
export const tokenAudience = 'sheetsmith-api'

/** A random token for links and refresh cookies: 256 bits, URL-safe. Only its hash is stored. */
export function createOpaqueToken(): string {
  return randomBytes(32).toString('base64url')
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}

export function signAccessToken(userId: string, secret: string, ttlSeconds: number): string {
  return jwt.sign({}, secret, { subject: userId, expiresIn: ttlSeconds, issuer: tokenIssuer, audience: tokenAudience, algorithm: 'HS256' })
}
