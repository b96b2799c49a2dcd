import { z } from 'zod'

/** Limits of the account forms, shown in the interface too. */
export const ACCOUNT_LIMITS = {
  displayNameChars: 80,
  /** A password's minimum length (the account brief: at least 10 characters). */
  passwordMinChars: 10,
  /** bcrypt reads only a password's first 72 bytes (common practice): longer ones are refused, not cut silently (non-ASCII characters take more than one byte, so this bounds ASCII exactly). */
  passwordMaxChars: 72,
} as const

/** How long a password reset link works (60 minutes). */
export const PASSWORD_RESET_LIFETIME_MINUTES = 60

const newPassword = z
  .string()
  .min(ACCOUNT_LIMITS.passwordMinChars, `A password has at least ${ACCOUNT_LIMITS.passwordMinChars} characters.`)
  .max(ACCOUNT_LIMITS.passwordMaxChars, `A password has at most ${ACCOUNT_LIMITS.passwordMaxChars} characters.`)

export const updateProfileSchema = z
  .object({
    displayName: z
      .string()
      .trim()
      .min(1, 'Enter the name others see.')
      .max(ACCOUNT_LIMITS.displayNameChars, `A display name has at most ${ACCOUNT_LIMITS.displayNameChars} characters.`)
      .describe('The name your team sees beside your work'),
  })
  .strict()
  .meta({ id: 'UpdateProfile' })
export type UpdateProfile = z.input<typeof updateProfileSchema>

export const changePasswordSchema = z
  .object({
    currentPassword: z.string().min(1, 'Enter your current password.').max(200),
    newPassword: newPassword.describe(`At least ${ACCOUNT_LIMITS.passwordMinChars} characters`),
  })
  .strict()
  .meta({ id: 'ChangePassword' })
export type ChangePassword = z.input<typeof changePasswordSchema>

export const revokedSessionsSchema = z
  .object({ revoked: z.number().int().describe('How many other sessions of yours were signed out') })
  .meta({ id: 'RevokedSessions' })
export type RevokedSessions = z.infer<typeof revokedSessionsSchema>

export const passwordResetRequestSchema = z
  .object({
    email: z.string().trim().toLowerCase().pipe(z.email({ message: 'Enter a valid e-mail address.' })),
  })
  .strict()
  .meta({ id: 'PasswordResetRequest' })
export type PasswordResetRequest = z.input<typeof passwordResetRequestSchema>

/** The one answer to a reset request, whether or not an account uses the address. */
export const PASSWORD_RESET_ACCEPTED_MESSAGE =
  'If an account uses that address, a link to set a new password is on its way. It works once, for 60 minutes.'

export const passwordResetAcceptedSchema = z
  .object({ message: z.string().describe('The same sentence whether or not an account uses the address') })
  .meta({ id: 'PasswordResetAccepted' })
export type PasswordResetAccepted = z.infer<typeof passwordResetAcceptedSchema>

export const passwordResetConfirmSchema = z
  .object({
    token: z.string().min(1, 'The link has no token.').max(200).describe('The `token` query value of the link in the mail'),
    password: newPassword.describe(`The new password, at least ${ACCOUNT_LIMITS.passwordMinChars} characters`),
  })
  .strict()
  .meta({ id: 'PasswordResetConfirm' })
export type PasswordResetConfirm = z.input<typeof passwordResetConfirmSchema>
