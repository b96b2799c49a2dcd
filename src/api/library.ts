import { z } from 'zod'
import {
  createdPathsSchema,
  fontPreviewSchema,
  pathDetailSchema,
  pathPageSchema,
  revisionDetailSchema,
  revisionSummarySchema,
  svgPreviewSchema,
  type BulkAction,
  type Bundle,
  type FontPreview,
  type ImportPaths,
  type NewPath,
  type PathDetail,
  type PathListItem,
  type PathPage,
  type RevisionDetail,
  type RevisionSummary,
  type SvgPreview,
  pathListQuerySchema,
} from '../../shared/api'
import { download, request } from './http'

const revisionListSchema = z.array(revisionSummarySchema)
const bulkResultSchema = z.object({ affected: z.number().int() })
const purgeResultSchema = z.object({ purged: z.number().int() })

/** A library page request as the store builds it: every paging field set, the trash flag optional. */
export type PathListRequest = Omit<z.output<typeof pathListQuerySchema>, 'trash'> & { trash?: '0' | '1' }

/** Glyphs to take from a font: typed text, or a range written as U+0041-U+005A. */
export type FontSelection = { text: string } | { range: string }

/** One page of a project's library (or of its trash), paged, sorted and filtered by the server. */
export function listPaths(projectId: number, query: PathListRequest, signal?: AbortSignal): Promise<PathPage> {
  return request(`/projects/${projectId}/paths`, {
    query: { ...query, q: query.q?.trim() || undefined },
    schema: pathPageSchema,
    signal,
  })
}

export function getPath(pathId: number): Promise<PathDetail> {
  return request(`/paths/${pathId}`, { schema: pathDetailSchema })
}

/** Renames a path, replaces its tags or changes its fill rule (editor). */
export function updatePath(
  pathId: number,
  patch: { name?: string; tags?: string[]; fillRule?: PathListItem['fillRule'] },
): Promise<PathDetail> {
  return request(`/paths/${pathId}`, { method: 'PATCH', body: patch, schema: pathDetailSchema })
}

/** Every revision of a path, as summaries (no path data). */
export function listRevisions(pathId: number): Promise<RevisionSummary[]> {
  return request(`/paths/${pathId}/revisions`, { schema: revisionListSchema })
}

/** One revision with its path data and diagnostics. */
export function getRevision(pathId: number, number: number): Promise<RevisionDetail> {
  return request(`/paths/${pathId}/revisions/${number}`, { schema: revisionDetailSchema })
}

/** Adds a new revision that copies revision `number` (editor); nothing is overwritten. */
export function restoreRevision(pathId: number, number: number, message?: string): Promise<PathDetail> {
  return request(`/paths/${pathId}/revisions/${number}/restore`, {
    method: 'POST',
    body: message === undefined ? {} : { message },
    schema: pathDetailSchema,
  })
}

/** Moves a path back out of the trash (editor, within the trash period). */
export function untrashPath(pathId: number): Promise<void> {
  return request(`/paths/${pathId}/untrash`, { method: 'POST' })
}

/** Deletes a trashed path for good (owner). */
export function purgePath(pathId: number): Promise<void> {
  return request(`/paths/${pathId}/purge`, { method: 'DELETE' })
}

/** Deletes every trashed path of a project for good (owner); resolves to how many. */
export async function emptyTrash(projectId: number): Promise<number> {
  const result = await request(`/projects/${projectId}/trash/empty`, { method: 'POST', schema: purgeResultSchema })
  return result.purged
}

/** Tags, untags, trashes or copies many paths at once; resolves to how many were affected. */
export async function bulkPaths(projectId: number, action: BulkAction): Promise<number> {
  const result = await request(`/projects/${projectId}/paths/bulk`, { method: 'POST', body: action, schema: bulkResultSchema })
  return result.affected
}

/** Creates paths from a confirmed preview, all or nothing (editor). */
export async function importPaths(projectId: number, input: ImportPaths): Promise<PathListItem[]> {
  const result = await request(`/projects/${projectId}/paths/import`, {
    method: 'POST',
    body: input,
    schema: createdPathsSchema,
  })
  return result.created
}

/** What the server finds in SVG files, without storing anything (multipart field `files`). */
export function previewSvgFiles(projectId: number, files: readonly File[]): Promise<SvgPreview> {
  const form = new FormData()
  for (const file of files) form.append('files', file, file.name)
  return request(`/projects/${projectId}/imports/svg/preview`, { method: 'POST', form, schema: svgPreviewSchema })
}

/** The font's metrics and the chosen glyphs' outlines, without storing anything. */
export function previewFontFile(projectId: number, file: File, selection: FontSelection): Promise<FontPreview> {
  const form = new FormData()
  form.append('file', file, file.name)
  if ('text' in selection) form.append('text', selection.text)
  else form.append('range', selection.range)
  return request(`/projects/${projectId}/imports/font/preview`, { method: 'POST', form, schema: fontPreviewSchema })
}

/** Imports a bundle exported from any project (editor); resolves to the created paths. */
export async function importBundle(projectId: number, bundle: Bundle): Promise<PathListItem[]> {
  const result = await request(`/projects/${projectId}/bundle`, { method: 'POST', body: bundle, schema: createdPathsSchema })
  return result.created
}

/** Downloads the chosen paths as one SVG file; resolves to the file name. */
export function exportSvg(projectId: number, ids: readonly number[]): Promise<string> {
  return download(`/projects/${projectId}/export.svg`, {
    query: { ids: ids.join(',') },
    fallbackName: `project-${projectId}-paths.svg`,
  })
}

/** Downloads the chosen paths with every revision as a Rootcast bundle (JSON); resolves to the file name. */
export function exportBundle(projectId: number, ids: readonly number[]): Promise<string> {
  return download(`/projects/${projectId}/bundle`, {
    query: { ids: ids.join(',') },
    fallbackName: `project-${projectId}-bundle.json`,
  })
}

/** Saves new path data as the next revision (editor); nothing is overwritten. */
export function addRevision(pathId: number, data: string, message: string): Promise<PathDetail> {
  return request(`/paths/${pathId}/revisions`, { method: 'POST', body: { data, message }, schema: pathDetailSchema })
}

/** Adds a path drawn on the canvas with its first revision (editor). */
export function createPath(projectId: number, input: NewPath): Promise<PathDetail> {
  return request(`/projects/${projectId}/paths`, { method: 'POST', body: input, schema: pathDetailSchema })
}
