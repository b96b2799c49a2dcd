import { z } from 'zod'
import { roleSchema } from './common'

export const loginRequestSchema = z
  .object({
    email: z.string().trim().toLowerCase().pipe(z.email({ message: 'Enter a valid e-mail address.' })),
    password: z.string().min(1, 'Enter your password.').max(200),
  })
  .meta({ id: 'LoginRequest' })
export type LoginRequest = z.infer<typeof loginRequestSchema>

export const userSchema = z
  .object({ id: z.number().int(), email: z.string(), displayName: z.string() })
  .meta({ id: 'User' })
export type User = z.infer<typeof userSchema>

export const teamMembershipSchema = z
  .object({ id: z.number().int(), name: z.string(), role: roleSchema })
  .meta({ id: 'TeamMembership' })
export type TeamMembership = z.infer<typeof teamMembershipSchema>

export const sessionInfoSchema = z
  .object({
    user: userSchema,
    teams: z.array(teamMembershipSchema),
    csrfToken: z
      .string()
      .describe('Send back as the X-CSRF-Token header on every state-changing request made with the session cookie'),
  })
  .meta({ id: 'SessionInfo' })
export type SessionInfo = z.infer<typeof sessionInfoSchema>
