import { z } from 'zod'
import { pageOf, pageQueryBase } from './common'

/** What a person did. The log is append-only: an entry is written once and never changed. */
export const ACTIVITY_ACTIONS = [
  'created', 'changed', 'restored', 'trashed', 'purged', 'deleted', 'imported', 'ran', 'cancelled',
  'invited', 'resent', 'revoked', 'joined', 'removed', 'reset',
] as const
export const activityActionSchema = z.enum(ACTIVITY_ACTIONS).meta({ id: 'ActivityAction' })
export type ActivityAction = z.infer<typeof activityActionSchema>

/** The kind of thing an entry is about. */
export const ACTIVITY_TARGET_TYPES = [
  'project', 'path', 'revision', 'probe-set', 'suite', 'check', 'run', 'audit',
  'token', 'invitation', 'member', 'account', 'team',
] as const
export const activityTargetTypeSchema = z.enum(ACTIVITY_TARGET_TYPES).meta({ id: 'ActivityTargetType' })
export type ActivityTargetType = z.infer<typeof activityTargetTypeSchema>

/** How the person reached the server: a browser session, a personal API token, or a link mailed to them. */
export const activityViaSchema = z.enum(['session', 'token', 'link']).meta({ id: 'ActivityVia' })
export type ActivityVia = z.infer<typeof activityViaSchema>

/** Limits of the stored text, shared by the table and the service. */
export const ACTIVITY_LIMITS = { actorNameChars: 120, targetNameChars: 200, summaryChars: 500 } as const

export const activityEntrySchema = z
  .object({
    id: z.number().int(),
    at: z.string().describe('ISO 8601 time of the write'),
    actor: z.object({
      id: z.number().int().nullable().describe('null once the person’s account is gone; the name stays'),
      name: z.string().describe('The display name at the time of the write'),
    }),
    via: activityViaSchema,
    action: activityActionSchema,
    targetType: activityTargetTypeSchema,
    targetId: z.number().int().nullable(),
    targetName: z.string(),
    summary: z.string().describe('One sentence'),
    teamId: z.number().int().nullable(),
    projectId: z.number().int().nullable().describe('The project the target belonged to; kept after the project is deleted'),
  })
  .meta({ id: 'ActivityEntry' })
export type ActivityEntry = z.infer<typeof activityEntrySchema>

const isoDate = z.iso.date('Give dates as YYYY-MM-DD.')

export const activityQuerySchema = z
  .object({
    page: pageQueryBase.page,
    pageSize: pageQueryBase.pageSize,
    actor: z.coerce.number().int().positive().max(2 ** 31).optional().describe('Only entries by this person (user id)'),
    action: activityActionSchema.optional(),
    targetType: activityTargetTypeSchema.optional(),
    from: isoDate.optional().describe('First day included (UTC), YYYY-MM-DD'),
    to: isoDate.optional().describe('Last day included (UTC), YYYY-MM-DD'),
  })
  .refine((q) => q.from === undefined || q.to === undefined || q.from <= q.to, { message: 'The first day comes after the last day.', path: ['from'] })
export type ActivityQuery = z.output<typeof activityQuerySchema>

export const activityPageSchema = pageOf(activityEntrySchema)
  .extend({
    people: z
      .array(z.object({ id: z.number().int(), name: z.string() }))
      .describe('Everyone with an entry in this log (any filter aside), by name: the choices of the person filter'),
  })
  .meta({ id: 'ActivityPage' })
export type ActivityPage = z.infer<typeof activityPageSchema>
