import type { RequestHandler } from 'express'
import passport from 'passport'
import { ExtractJwt, Strategy as JwtStrategy } from 'passport-jwt'
import type { Database } from '../db/client.js'
import { unauthenticated } from '../errors.js'
import { tokenAudience, tokenIssuer } from '../features/auth/tokens.js'
import { findUserById } from '../features/auth/auth.repo.js'

export interface AuthenticatedUser {
  id: string
  email: string
  name: string
}

declare global {
  // Passport types `req.user` as Express.User; ours carries the fields every route needs.
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface User extends AuthenticatedUser {}
  }
}

/**
 * Passport with one strategy: a short-lived HS256 access token in the Authorization header.
 * A token issued before the user's last password change is refused, so a changed password ends old sessions.
 */
export function createPassport(db: Database, jwtSecret: string) {
  const instance = new passport.Passport()
  instance.use(
    new JwtStrategy(
      {
        jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
        secretOrKey: jwtSecret,
        issuer: tokenIssuer,
        audience: tokenAudience,
        algorithms: ['HS256'],
      },
      (payload: { sub?: string; iat?: number }, done: (error: unknown, user?: Express.User | false) => void) => {
        if (!payload.sub || !/^[0-9a-f-]{36}$/i.test(payload.sub)) return done(null, false)
        findUserById(db, payload.sub)
          .then((user) => {
            if (!user) return done(null, false)
            const changedAtSeconds = Math.floor(user.passwordChangedAt.getTime() / 1000)
            if (payload.iat !== undefined && payload.iat < changedAtSeconds) return done(null, false)
            done(null, { id: user.id, email: user.email, name: user.name })
          })
          .catch(done)
      },
    ),
  )
  return instance
}

type PassportInstance = ReturnType<typeof createPassport>

/** Requires a valid access token; answers 401 in the shared error shape otherwise. */
export function requireAuth(instance: PassportInstance): RequestHandler {
  return (request, response, next) => {
    instance.authenticate('jwt', { session: false }, (error: unknown, user: Express.User | false) => {
      if (error) return next(error)
      if (!user) return next(unauthenticated('Your session has expired or is not valid. Sign in again.'))
      request.user = user
      next()
    })(request, response, next)
  }
}

/** Reads the access token when one is sent; a request without one goes on anonymously. */
export function optionalAuth(instance: PassportInstance): RequestHandler {
  return (request, response, next) => {
    if (!request.headers.authorization) return next()
    requireAuth(instance)(request, response, next)
  }
}
