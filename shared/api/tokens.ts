import { z } from 'zod'

/** Limits of a personal API token, shown in the interface too. */
export const TOKEN_LIMITS = {
  nameChars: 80,
  minDays: 1,
  maxDays: 365,
  /** Characters of the secret kept in clear, so a person can recognise a token in the list. */
  prefixChars: 10,
} as const

/** Every secret starts with this, so a leaked one is easy to recognise (and to scan for). */
export const TOKEN_SECRET_PREFIX = 'rcp_'

export const newTokenSchema = z
  .object({
    name: z
      .string()
      .trim()
      .min(1, 'A token needs a name.')
      .max(TOKEN_LIMITS.nameChars, `A token name has at most ${TOKEN_LIMITS.nameChars} characters.`)
      .describe('What the token is for, e.g. the pipeline that uses it'),
    expiresInDays: z
      .number()
      .int('The expiry is a whole number of days.')
      .min(TOKEN_LIMITS.minDays, `A token lives at least ${TOKEN_LIMITS.minDays} day.`)
      .max(TOKEN_LIMITS.maxDays, `A token lives at most ${TOKEN_LIMITS.maxDays} days.`)
      .describe('Days from now until the token stops working'),
  })
  .strict()
  .meta({ id: 'NewToken' })
export type NewToken = z.input<typeof newTokenSchema>

export const tokenSchema = z
  .object({
    id: z.number().int(),
    name: z.string(),
    prefix: z.string().describe(`The first ${TOKEN_LIMITS.prefixChars} characters of the secret, for recognising it`),
    createdAt: z.string().describe('ISO 8601 time'),
    expiresAt: z.string().describe('ISO 8601 time; the token is refused from then on'),
    lastUsedAt: z.string().nullable().describe('ISO 8601 time of the latest request made with it, to the minute'),
    revokedAt: z.string().nullable().describe('ISO 8601 time it was revoked; null while not revoked'),
  })
  .meta({ id: 'Token' })
export type Token = z.infer<typeof tokenSchema>

export const createdTokenSchema = tokenSchema
  .extend({
    secret: z
      .string()
      .describe('Send as `Authorization: Bearer <secret>`. Shown only in this answer: the server keeps a hash of it, never the secret'),
  })
  .meta({ id: 'CreatedToken' })
export type CreatedToken = z.infer<typeof createdTokenSchema>

export const tokenListSchema = z.object({ items: z.array(tokenSchema) }).meta({ id: 'TokenList' })
export type TokenList = z.infer<typeof tokenListSchema>

export type TokenStatus = 'active' | 'expired' | 'revoked'

/** Whether a token still works at `now` (ms since the epoch); revoked wins over expired. */
export function tokenStatus(token: Pick<Token, 'expiresAt' | 'revokedAt'>, now: number): TokenStatus {
  if (token.revokedAt !== null) return 'revoked'
  return Date.parse(token.expiresAt) <= now ? 'expired' : 'active'
}
