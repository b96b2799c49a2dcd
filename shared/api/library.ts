import { z } from 'zod'
import { pageQueryBase } from './common'

export const ORIGINS = ['drawn', 'svg', 'font'] as const
export const originSchema = z.enum(ORIGINS).meta({ id: 'PathOrigin' })
export const fillRuleSchema = z.enum(['nonzero', 'evenodd']).meta({ id: 'FillRule' })

/** Paths in the trash can be restored for this many days; then they are purged. */
export const TRASH_DAYS = 30
/** Limits of the upload routes, shown in the interface too. */
export const UPLOAD_LIMITS = { svgFiles: 20, svgBytes: 2 * 1024 * 1024, fontBytes: 10 * 1024 * 1024, glyphs: 500 } as const

const tag = z.string().trim().min(1, 'A tag cannot be empty.').max(40, 'A tag has at most 40 characters.').regex(/^[^,]+$/, 'A tag cannot contain a comma.')
export const tagsSchema = z.array(tag).max(20, 'At most 20 tags per path.')
const pathName = z.string().trim().min(1, 'A path needs a name.').max(200, 'A path name has at most 200 characters.')
const pathDataText = z.string().max(2_000_000, 'Path data has at most 2,000,000 characters.')
const message = z.string().trim().max(500, 'A message has at most 500 characters.')
const units = z.string().trim().min(1).max(20)

export const bboxSchema = z.tuple([z.number(), z.number(), z.number(), z.number()]).meta({ id: 'BoundingBox', description: '[minX, minY, maxX, maxY]' })
export const segmentCountsSchema = z
  .object({ line: z.number().int(), quadratic: z.number().int(), cubic: z.number().int(), arc: z.number().int() })
  .meta({ id: 'SegmentCounts' })

export const diagnosticSchema = z
  .object({
    kind: z.enum(['zero-length-segment', 'degenerate-contour', 'straight-curve', 'cusp', 'loop', 'open-subpath', 'coincident-points']),
    segment: z.number().int().nullable(),
    subpath: z.number().int().nullable(),
    t: z.number().nullable(),
    point: z.tuple([z.number(), z.number()]).nullable(),
    message: z.string(),
  })
  .meta({ id: 'Diagnostic' })
export type DiagnosticItem = z.infer<typeof diagnosticSchema>

export const pathListItemSchema = z
  .object({
    id: z.number().int(),
    projectId: z.number().int(),
    name: z.string(),
    tags: z.array(z.string()),
    origin: originSchema,
    sourceFile: z.string().nullable(),
    units: z.string(),
    fillRule: fillRuleSchema,
    revision: z.number().int().describe('Number of the current revision'),
    revisions: z.number().int(),
    segments: z.number().int(),
    counts: segmentCountsSchema,
    warnings: z.number().int().describe('Number of diagnostics of the current revision'),
    bbox: bboxSchema.nullable(),
    data: z.string().describe('SVG path data of the current revision'),
    updatedAt: z.string(),
    deletedAt: z.string().nullable(),
  })
  .meta({ id: 'PathListItem' })
export type PathListItem = z.infer<typeof pathListItemSchema>

export const pathDetailSchema = pathListItemSchema
  .extend({
    metadata: z.record(z.string(), z.unknown()).nullable().describe('Font metrics for glyphs: unitsPerEm, ascender, descender, advanceWidth, …'),
    diagnostics: z.array(diagnosticSchema),
    message: z.string().describe('Message of the current revision'),
    author: z.string().nullable(),
    createdAt: z.string(),
  })
  .meta({ id: 'PathDetail' })
export type PathDetail = z.infer<typeof pathDetailSchema>

export const pathSortKeys = ['name', 'updatedAt', 'segments', 'warnings', 'origin'] as const
export const pathListQuerySchema = z.object({
  ...pageQueryBase,
  sort: z.enum(pathSortKeys).default('name'),
  tag: z.string().trim().max(40).optional(),
  origin: originSchema.optional(),
  warnings: z.enum(['with', 'without']).optional(),
  trash: z.enum(['0', '1']).default('0').describe('1 lists the trash instead of the library'),
})
export type PathListQuery = z.input<typeof pathListQuerySchema>

export const pathPageSchema = z
  .object({
    items: z.array(pathListItemSchema),
    total: z.number().int(),
    page: z.number().int(),
    pageSize: z.number().int(),
    tags: z.array(z.string()).describe('Every tag used in the project, for filters'),
  })
  .meta({ id: 'PathPage' })
export type PathPage = z.infer<typeof pathPageSchema>

export const newPathSchema = z
  .object({
    name: pathName,
    data: pathDataText,
    fillRule: fillRuleSchema.default('nonzero'),
    tags: tagsSchema.default([]),
    units: units.default('px'),
    message: message.default(''),
    sourceFile: z.string().trim().max(255).nullable().default(null),
    metadata: z.record(z.string(), z.union([z.string(), z.number(), z.boolean(), z.null()])).nullable().default(null),
  })
  .strict()
  .meta({ id: 'NewPath' })
export type NewPath = z.input<typeof newPathSchema>

export const importPathsSchema = z
  .object({
    origin: originSchema,
    paths: z.array(newPathSchema.omit({ message: true })).min(1, 'Choose at least one path to import.').max(5000, 'At most 5000 paths per import.'),
    message: message.default(''),
  })
  .strict()
  .meta({ id: 'ImportPaths' })
export type ImportPaths = z.input<typeof importPathsSchema>

export const updatePathSchema = z
  .object({ name: pathName.optional(), tags: tagsSchema.optional(), fillRule: fillRuleSchema.optional() })
  .strict()
  .refine((v) => v.name !== undefined || v.tags !== undefined || v.fillRule !== undefined, { message: 'Give a name, tags or a fill rule to change.' })
  .meta({ id: 'UpdatePath' })

export const newRevisionSchema = z.object({ data: pathDataText, message: message.default('') }).strict().meta({ id: 'NewRevision' })
export const restoreRevisionSchema = z.object({ message: message.optional() }).strict().meta({ id: 'RestoreRevision' })

export const revisionSummarySchema = z
  .object({
    number: z.number().int(),
    message: z.string(),
    author: z.string().nullable(),
    createdAt: z.string(),
    segments: z.number().int(),
    counts: segmentCountsSchema,
    bbox: bboxSchema.nullable(),
    warnings: z.number().int(),
  })
  .meta({ id: 'RevisionSummary' })
export const revisionDetailSchema = revisionSummarySchema
  .extend({ data: z.string(), diagnostics: z.array(diagnosticSchema), current: z.boolean() })
  .meta({ id: 'RevisionDetail' })
export type RevisionSummary = z.infer<typeof revisionSummarySchema>
export type RevisionDetail = z.infer<typeof revisionDetailSchema>

export const bulkActionSchema = z
  .discriminatedUnion('action', [
    z.object({ action: z.literal('tag'), ids: z.array(z.number().int().positive()).min(1).max(5000), tags: tagsSchema.min(1) }),
    z.object({ action: z.literal('untag'), ids: z.array(z.number().int().positive()).min(1).max(5000), tags: tagsSchema.min(1) }),
    z.object({ action: z.literal('trash'), ids: z.array(z.number().int().positive()).min(1).max(5000) }),
    z.object({ action: z.literal('copy'), ids: z.array(z.number().int().positive()).min(1).max(5000), targetProjectId: z.number().int().positive() }),
  ])
  .meta({ id: 'BulkAction' })
export type BulkAction = z.infer<typeof bulkActionSchema>

/** What the previews add to each imported path: the core's view of it. */
const analysed = {
  segments: z.number().int(),
  counts: segmentCountsSchema,
  bbox: bboxSchema.nullable(),
  diagnostics: z.array(diagnosticSchema),
}

export const svgPreviewSchema = z
  .object({
    files: z.array(
      z.object({
        fileName: z.string(),
        ok: z.boolean(),
        code: z.string().optional().describe('Why the file was refused'),
        message: z.string().optional(),
        warnings: z.array(z.string()),
        paths: z.array(
          z.object({
            name: z.string(),
            data: z.string(),
            fillRule: fillRuleSchema,
            element: z.string(),
            warnings: z.array(z.string()),
            ...analysed,
          }),
        ),
      }),
    ),
  })
  .meta({ id: 'SvgPreview' })
export type SvgPreview = z.infer<typeof svgPreviewSchema>

export const fontInfoSchema = z
  .object({
    family: z.string(),
    format: z.enum(['TTF', 'OTF', 'WOFF', 'WOFF2']),
    outlines: z.enum(['quadratic', 'cubic']),
    unitsPerEm: z.number(),
    ascender: z.number(),
    descender: z.number(),
    glyphCount: z.number().int(),
  })
  .meta({ id: 'FontInfo' })

export const fontPreviewSchema = z
  .object({
    fileName: z.string(),
    font: fontInfoSchema,
    glyphs: z.array(
      z.object({
        name: z.string(),
        codePoint: z.number().int(),
        glyphName: z.string().nullable(),
        data: z.string(),
        advanceWidth: z.number(),
        warnings: z.array(z.string()),
        ...analysed,
      }),
    ),
    missing: z.array(z.number().int()).describe('Code points the font has no glyph for'),
  })
  .meta({ id: 'FontPreview' })
export type FontPreview = z.infer<typeof fontPreviewSchema>

export const fontPreviewFieldsSchema = z.object({
  text: z.string().max(500).optional().describe('Glyphs to import, typed as text'),
  range: z
    .string()
    .trim()
    .regex(/^U\+[0-9A-Fa-f]{1,6}(-U\+[0-9A-Fa-f]{1,6})?$/, 'Write a range as U+0041-U+005A.')
    .optional(),
})

export const bundleSchema = z
  .object({
    format: z.literal('rootcast-bundle'),
    version: z.literal(1),
    exportedAt: z.string(),
    project: z.object({ name: z.string(), description: z.string() }),
    paths: z
      .array(
        z.object({
          name: pathName,
          tags: tagsSchema,
          origin: originSchema,
          sourceFile: z.string().max(255).nullable(),
          units,
          fillRule: fillRuleSchema,
          metadata: z.record(z.string(), z.unknown()).nullable(),
          revisions: z
            .array(z.object({ number: z.number().int().positive(), data: pathDataText, message: z.string().max(500), createdAt: z.string() }))
            .min(1)
            .max(1000),
        }),
      )
      .max(5000),
  })
  .meta({ id: 'RootcastBundle' })
export type Bundle = z.infer<typeof bundleSchema>

export const createdPathsSchema = z.object({ created: z.array(pathListItemSchema) }).meta({ id: 'CreatedPaths' })
