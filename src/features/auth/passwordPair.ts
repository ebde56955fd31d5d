import { z } from 'zod'
import { passwordSchema } from '../../../shared/schemas/index'

/** A new password typed twice; the server only sees the first, so the match is checked here. */
export const newPasswordPairSchema = z
  .object({ password: passwordSchema, passwordAgain: z.string() })
  .refine((pair) => pair.password === pair.passwordAgain, { path: ['passwordAgain'], error: 'The two passwords differ' })
