import { z } from 'zod'
import { idParam } from './common'
import { pointSchema, probeSchema } from './compute'

/** Limits of one probe set, shown in the interface too. */
export const PROBE_SET_LIMITS = {
  probes: 500,
  sweeps: 50,
  /** Lines in one sweep. */
  sweepCount: 2000,
  nameChars: 120,
  descriptionChars: 500,
  /** A sweep's angle in degrees lies in −360..360. */
  angleDegrees: 360,
} as const

/**
 * Parallel lines as the canvas draws them: line i (0 ≤ i < count) passes through
 * origin + i·spacing·(−sin angle, cos angle) and runs along (cos angle, sin angle); the angle
 * is in degrees from +x towards +y (the path's y-down frame).
 */
export const probeSetSweepSchema = z
  .object({
    angle: z
      .number()
      .min(-PROBE_SET_LIMITS.angleDegrees, `A sweep angle is at least −${PROBE_SET_LIMITS.angleDegrees} degrees.`)
      .max(PROBE_SET_LIMITS.angleDegrees, `A sweep angle is at most ${PROBE_SET_LIMITS.angleDegrees} degrees.`)
      .describe('Degrees from +x towards +y (y down)'),
    spacing: z.number().positive('A sweep needs a spacing greater than 0.').describe('Distance between neighbouring lines, in path units'),
    count: z
      .number()
      .int('A sweep has a whole number of lines.')
      .min(1, 'A sweep has at least one line.')
      .max(PROBE_SET_LIMITS.sweepCount, `A sweep has at most ${PROBE_SET_LIMITS.sweepCount} lines.`),
    origin: pointSchema.describe('A point on the first line'),
  })
  .strict()
  .meta({ id: 'ProbeSetSweep' })
export type ProbeSetSweep = z.infer<typeof probeSetSweepSchema>

const probeSetName = z
  .string()
  .trim()
  .min(1, 'A probe set needs a name.')
  .max(PROBE_SET_LIMITS.nameChars, `A probe set name has at most ${PROBE_SET_LIMITS.nameChars} characters.`)
const probeSetDescription = z
  .string()
  .trim()
  .max(PROBE_SET_LIMITS.descriptionChars, `A description has at most ${PROBE_SET_LIMITS.descriptionChars} characters.`)

/** The writable fields, none defaulted: NewProbeSet adds the defaults, UpdateProbeSet makes them optional. */
const writableFields = z.object({
  name: probeSetName,
  description: probeSetDescription,
  pathId: z.number().int().positive().describe('A live path of the same project'),
  revision: z.number().int().positive().describe('The number of the path revision the set was made on'),
  probes: z.array(probeSchema).max(PROBE_SET_LIMITS.probes, `A probe set has at most ${PROBE_SET_LIMITS.probes} probes.`),
  sweeps: z.array(probeSetSweepSchema).max(PROBE_SET_LIMITS.sweeps, `A probe set has at most ${PROBE_SET_LIMITS.sweeps} sweeps.`),
})

export const newProbeSetSchema = writableFields
  .extend({ description: probeSetDescription.default('') })
  .strict()
  .meta({ id: 'NewProbeSet' })
export type NewProbeSet = z.input<typeof newProbeSetSchema>

export const updateProbeSetSchema = writableFields
  .partial()
  .strict()
  .refine((v) => Object.values(v).some((field) => field !== undefined), { message: 'Give at least one field to change.' })
  .meta({ id: 'UpdateProbeSet' })
export type UpdateProbeSet = z.input<typeof updateProbeSetSchema>

const probeSetBase = z.object({
  id: z.number().int(),
  projectId: z.number().int(),
  pathId: z.number().int(),
  pathName: z.string().describe('The path’s current name'),
  revision: z.number().int(),
  name: z.string(),
  description: z.string(),
  author: z.string().nullable().describe('Display name of the person who made the set'),
  createdAt: z.string().describe('ISO 8601 time'),
  updatedAt: z.string().describe('ISO 8601 time'),
})

export const probeSetSchema = probeSetBase
  .extend({ probes: z.array(probeSchema), sweeps: z.array(probeSetSweepSchema) })
  .meta({ id: 'ProbeSet' })
export type ProbeSet = z.infer<typeof probeSetSchema>

export const probeSetSummarySchema = probeSetBase
  .extend({ probeCount: z.number().int(), sweepCount: z.number().int() })
  .meta({ id: 'ProbeSetSummary' })
export type ProbeSetSummary = z.infer<typeof probeSetSummarySchema>

export const probeSetListSchema = z.object({ items: z.array(probeSetSummarySchema) }).meta({ id: 'ProbeSetList' })
export type ProbeSetList = z.infer<typeof probeSetListSchema>

export const probeSetListQuerySchema = z.object({
  pathId: idParam.optional().describe('Only the sets made on this path'),
})
