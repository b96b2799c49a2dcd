import type { PathDetail, PathListItem, PathPage, Project, RevisionDetail, RevisionSummary } from '../../shared/api'

/** Invented scenario data (product.md's demo studio): the "Wayfinding icons" project of team 3. */
export const PROJECT_ID = 42
export const TEAM_ID = 3

export const wayfindingProject: Project = {
  id: PROJECT_ID,
  teamId: TEAM_ID,
  name: 'Wayfinding icons',
  description: 'Arrows, a map pin, a ferry',
  pathCount: 2,
  createdAt: '2026-10-01T08:00:00.000Z',
  updatedAt: '2026-11-15T12:30:00.000Z',
  createdBy: 'Ines Ortega',
}

export function pathItem(id: number, name: string, overrides: Partial<PathListItem> = {}): PathListItem {
  return {
    id,
    projectId: PROJECT_ID,
    name,
    tags: ['arrows'],
    origin: 'svg',
    sourceFile: 'wayfinding.svg',
    units: 'px',
    fillRule: 'nonzero',
    revision: 2,
    revisions: 2,
    segments: 5,
    counts: { line: 3, quadratic: 0, cubic: 2, arc: 0 },
    warnings: 0,
    bbox: [2, 4, 22, 20],
    data: 'M2 12 L12 4 L22 12 C22 16 18 20 12 20 C6 20 2 16 2 12 Z',
    updatedAt: '2026-11-20T16:40:00.000Z',
    deletedAt: null,
    ...overrides,
  }
}

export function pathPage(items: PathListItem[], extra: Partial<PathPage> = {}): PathPage {
  return { items, total: items.length, page: 1, pageSize: 25, tags: ['arrows', 'ferry'], ...extra }
}

export function pathDetail(item: PathListItem, overrides: Partial<PathDetail> = {}): PathDetail {
  return {
    ...item,
    metadata: null,
    diagnostics: [],
    message: 'Widened the arrow head',
    author: 'Ines Ortega',
    createdAt: '2026-11-02T09:15:00.000Z',
    ...overrides,
  }
}

export function revisionSummary(number: number, overrides: Partial<RevisionSummary> = {}): RevisionSummary {
  return {
    number,
    message: `Revision ${number} message`,
    author: 'Ines Ortega',
    createdAt: `2026-11-0${number}T10:00:00.000Z`,
    segments: 3 + number,
    counts: { line: 3, quadratic: 0, cubic: number, arc: 0 },
    bbox: [0, 0, 10 * number, 10],
    warnings: 0,
    ...overrides,
  }
}

export function revisionDetail(number: number, data: string, current: boolean): RevisionDetail {
  return { ...revisionSummary(number), data, diagnostics: [], current }
}
