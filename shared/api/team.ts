import { z } from 'zod'
import { ACCOUNT_LIMITS } from './account'
import { roleSchema } from './common'

/** Limits of invitations and new accounts, shown in the interface too. */
export const TEAM_LIMITS = {
  /** An invitation link works this many days from its latest send. */
  invitationDays: 7,
  emailChars: 254,
} as const

const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .max(TEAM_LIMITS.emailChars, `An e-mail address has at most ${TEAM_LIMITS.emailChars} characters.`)
  .pipe(z.email({ message: 'Enter a valid e-mail address.' }))

export const newInvitationSchema = z
  .object({
    email: emailSchema.describe('Address the invitation is mailed to (stored lower-cased)'),
    role: roleSchema.describe('Role the person gets on accepting'),
  })
  .strict()
  .meta({ id: 'NewInvitation' })
export type NewInvitation = z.input<typeof newInvitationSchema>

export const invitationStatusSchema = z.enum(['pending', 'expired']).meta({ id: 'InvitationStatus' })
export type InvitationStatus = z.infer<typeof invitationStatusSchema>

export const invitationSchema = z
  .object({
    id: z.number().int(),
    teamId: z.number().int(),
    email: z.string(),
    role: roleSchema,
    invitedBy: z.string().nullable().describe('Display name of the person who sent it; null once their account is gone'),
    createdAt: z.string().describe('ISO 8601 time'),
    lastSentAt: z.string().describe('ISO 8601 time of the latest mail'),
    expiresAt: z.string().describe(`ISO 8601 time; ${TEAM_LIMITS.invitationDays} days after the latest mail`),
    status: invitationStatusSchema.describe('pending until it expires; an expired one can be resent'),
  })
  .meta({ id: 'Invitation' })
export type Invitation = z.infer<typeof invitationSchema>

export const invitationListSchema = z
  .object({ items: z.array(invitationSchema).describe('Open invitations (neither accepted nor revoked), newest first') })
  .meta({ id: 'InvitationList' })
export type InvitationList = z.infer<typeof invitationListSchema>

const invitationTokenSchema = z.string().min(1, 'The invitation link has no token.').max(200)

export const invitationLookupQuerySchema = z.object({ token: invitationTokenSchema.describe('The secret from the invitation link') })

export const invitationLookupSchema = z
  .object({
    teamId: z.number().int(),
    teamName: z.string(),
    email: z.string(),
    role: roleSchema,
    invitedBy: z.string().nullable(),
    accountExists: z.boolean().describe('True when an account with this address exists: accepting then needs that account signed in'),
    expiresAt: z.string().describe('ISO 8601 time'),
  })
  .meta({ id: 'InvitationLookup' })
export type InvitationLookup = z.infer<typeof invitationLookupSchema>

/** A new account's password and name, by the Account screen's rules (ACCOUNT_LIMITS). */
const newPasswordSchema = z
  .string()
  .min(ACCOUNT_LIMITS.passwordMinChars, `A password has at least ${ACCOUNT_LIMITS.passwordMinChars} characters.`)
  .max(ACCOUNT_LIMITS.passwordMaxChars, `A password has at most ${ACCOUNT_LIMITS.passwordMaxChars} characters.`)
const displayNameSchema = z
  .string()
  .trim()
  .min(1, 'Enter the name others see.')
  .max(ACCOUNT_LIMITS.displayNameChars, `A display name has at most ${ACCOUNT_LIMITS.displayNameChars} characters.`)

export const acceptInvitationSchema = z
  .object({
    token: invitationTokenSchema,
    displayName: displayNameSchema.optional().describe('Needed when no account exists for the address'),
    password: newPasswordSchema.optional().describe('Needed when no account exists for the address'),
  })
  .strict()
  .meta({ id: 'AcceptInvitation' })
export type AcceptInvitation = z.input<typeof acceptInvitationSchema>

export const memberSchema = z
  .object({
    userId: z.number().int(),
    displayName: z.string(),
    email: z.string(),
    role: roleSchema,
    joinedAt: z.string().describe('ISO 8601 time'),
    lastActiveAt: z.string().nullable().describe('ISO 8601 time of the latest signed-in request, to the minute; null when never'),
  })
  .meta({ id: 'Member' })
export type Member = z.infer<typeof memberSchema>

export const memberListSchema = z.object({ items: z.array(memberSchema).describe('Owners first, then by name') }).meta({ id: 'MemberList' })
export type MemberList = z.infer<typeof memberListSchema>

export const memberRoleSchema = z.object({ role: roleSchema }).strict().meta({ id: 'MemberRole' })
export type MemberRole = z.input<typeof memberRoleSchema>
