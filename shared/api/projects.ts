import { z } from 'zod'
import { pageOf, pageQueryBase } from './common'

const projectName = z
  .string()
  .trim()
  .min(1, 'A project needs a name.')
  .max(120, 'A project name has at most 120 characters.')
const projectDescription = z.string().trim().max(2000, 'A description has at most 2000 characters.')

export const projectSchema = z
  .object({
    id: z.number().int(),
    teamId: z.number().int(),
    name: z.string(),
    description: z.string(),
    pathCount: z.number().int(),
    createdAt: z.string().describe('ISO 8601 time'),
    updatedAt: z.string().describe('ISO 8601 time'),
    createdBy: z.string().nullable().describe('Display name of the creator'),
  })
  .meta({ id: 'Project' })
export type Project = z.infer<typeof projectSchema>

export const projectSortKeys = ['name', 'createdAt', 'updatedAt', 'pathCount'] as const
export const projectListQuerySchema = z.object({
  ...pageQueryBase,
  sort: z.enum(projectSortKeys).default('name'),
})
export type ProjectListQuery = z.infer<typeof projectListQuerySchema>

export const projectPageSchema = pageOf(projectSchema).meta({ id: 'ProjectPage' })
export type ProjectPage = z.infer<typeof projectPageSchema>

export const createProjectSchema = z
  .object({ name: projectName, description: projectDescription.default('') })
  .strict()
  .meta({ id: 'CreateProject' })
export type CreateProject = z.input<typeof createProjectSchema>

export const updateProjectSchema = z
  .object({ name: projectName.optional(), description: projectDescription.optional() })
  .strict()
  .refine((v) => v.name !== undefined || v.description !== undefined, {
    message: 'Give a new name or description.',
  })
  .meta({ id: 'UpdateProject' })
export type UpdateProject = z.input<typeof updateProjectSchema>
