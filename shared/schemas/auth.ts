import { z } from 'zod'

/** Trimmed and lower-cased before it is checked, so a pasted address with spaces or capitals still works. */
export const emailSchema = z
  .string({ error: 'Enter a valid e-mail address' })
  .trim()
  .toLowerCase()
  .pipe(z.email({ error: 'Enter a valid e-mail address' }).max(254, { error: 'Use at most 254 characters' }))
export const passwordSchema = z
  .string({ error: 'Enter a password' })
  .min(10, { error: 'Use at least 10 characters' })
  .max(200, { error: 'Use at most 200 characters' })
export const personNameSchema = z.string({ error: 'Enter a name' }).trim().min(1, { error: 'Enter a name' }).max(100)
export const workspaceNameSchema = z.string({ error: 'Enter a workspace name' }).trim().min(1, { error: 'Enter a workspace name' }).max(100)

export const unitSystems = ['mm', 'in'] as const
export const unitSystemSchema = z.enum(unitSystems)
export type UnitSystem = z.infer<typeof unitSystemSchema>

export const signUpRequestSchema = z.object({
  name: personNameSchema,
  email: emailSchema,
  password: passwordSchema,
  /** Optional; defaults to "<name>'s studio". */
  workspaceName: workspaceNameSchema.optional(),
})
export type SignUpRequest = z.input<typeof signUpRequestSchema>

export const signInRequestSchema = z.object({
  email: emailSchema,
  password: z.string({ error: 'Enter your password' }).min(1, { error: 'Enter your password' }).max(200),
})
export type SignInRequest = z.input<typeof signInRequestSchema>

export const passwordResetRequestSchema = z.object({ email: emailSchema })
export const passwordResetConfirmSchema = z.object({
  token: z.string({ error: 'The reset link is incomplete' }).min(20).max(200),
  password: passwordSchema,
})

export const userSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  unitSystem: unitSystemSchema,
  createdAt: z.string(),
})
export type User = z.infer<typeof userSchema>

/** Answer of sign-up, sign-in and refresh: a short-lived access token; the refresh token travels in an httpOnly cookie. */
export const sessionResponseSchema = z.object({
  accessToken: z.string(),
  expiresInSeconds: z.number(),
  user: userSchema,
})
export type SessionResponse = z.infer<typeof sessionResponseSchema>

export const updateMeRequestSchema = z
  .object({
    name: personNameSchema.optional(),
    unitSystem: unitSystemSchema.optional(),
  })
  .refine((body) => body.name !== undefined || body.unitSystem !== undefined, { error: 'Send a name or a unit system to change' })
export type UpdateMeRequest = z.input<typeof updateMeRequestSchema>

export const changePasswordRequestSchema = z.object({
  currentPassword: z.string({ error: 'Enter your current password' }).min(1, { error: 'Enter your current password' }),
  newPassword: passwordSchema,
})
