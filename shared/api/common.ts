import { z } from 'zod'

/** The one error shape of the whole API (see the computation contract). */
export const apiErrorSchema = z
  .object({
    error: z.object({
      code: z.string().describe('Machine-readable code, e.g. validation, unauthenticated, forbidden, not_found, limit'),
      message: z.string().describe('A sentence a person understands'),
      details: z.array(z.unknown()).optional(),
    }),
  })
  .meta({ id: 'ApiError' })
export type ApiError = z.infer<typeof apiErrorSchema>

export const roleSchema = z.enum(['owner', 'editor', 'viewer']).meta({ id: 'Role' })
export type Role = z.infer<typeof roleSchema>

/** Numeric id in a URL path: positive integer. */
export const idParam = z.coerce.number().int().positive().max(2 ** 31)

export const pageQueryBase = {
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
  order: z.enum(['asc', 'desc']).default('asc'),
  q: z.string().trim().max(200).optional().describe('Case-insensitive substring filter on the name'),
}

export function pageOf<T extends z.ZodType>(item: T) {
  return z.object({
    items: z.array(item),
    total: z.number().int().describe('Number of items matching the filter, over all pages'),
    page: z.number().int(),
    pageSize: z.number().int(),
  })
}
