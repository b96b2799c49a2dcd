import { defineStore } from 'pinia'
import { computed, readonly, ref, shallowRef } from 'vue'
import type { Bundle, ImportPaths, PathListItem, PathPage, Project, pathSortKeys, ORIGINS } from '../../shared/api'
import { useLatestPage } from '../composables/useLatestPage'
import {
  bulkPaths,
  emptyTrash,
  exportBundle,
  exportSvg,
  importBundle,
  importPaths,
  listPaths,
  purgePath,
  untrashPath,
  type PathListRequest,
} from '../api/library'
import { listProjects } from '../api/projects'
import { toApiRequestError, type ApiRequestError } from '../api/http'

export type PathSortKey = (typeof pathSortKeys)[number]
export type PathOrigin = (typeof ORIGINS)[number]
export type WarningsFilter = 'with' | 'without'
export type SortOrder = 'asc' | 'desc'

export const PATH_PAGE_SIZES = [10, 25, 50, 100] as const

/** The largest page the projects route serves (shared/api pageQueryBase): the copy dialog lists one page. */
export const COPY_TARGET_LIMIT = 200

/** What the table's filter row can narrow the library to; null means "any". */
export interface PathFilters {
  text: string
  tag: string | null
  origin: PathOrigin | null
  warnings: WarningsFilter | null
}

/** Table state from the data table: page, rows per page and the one sorted column. */
export interface PathTableOptions {
  page: number
  pageSize: number
  sort: PathSortKey
  order: SortOrder
}

const NO_FILTERS: PathFilters = { text: '', tag: null, origin: null, warnings: null }

/**
 * The open project's library (or its trash) as the server pages, sorts and filters it, and
 * the actions on many paths at once. Actions reject with an ApiRequestError for the caller
 * to show; after a change the page reloads.
 */
export const useLibraryStore = defineStore('library', () => {
  const projectId = ref<number | null>(null)
  const tags = ref<string[]>([])
  const page = ref(1)
  const pageSize = ref<number>(PATH_PAGE_SIZES[1])
  const sort = ref<PathSortKey>('name')
  const order = ref<SortOrder>('asc')
  const filters = ref<PathFilters>({ ...NO_FILTERS })
  const isTrash = ref(false)

  const copyTargets = ref<Project[]>([])
  const copyTargetsTotal = ref(0)
  const isLoadingCopyTargets = ref(false)
  const copyTargetsError = shallowRef<ApiRequestError | null>(null)

  /** The request the table shows; defaults (first trash flag, empty filters) are left out of the URL. */
  const query = computed<PathListRequest>(() => ({
    page: page.value,
    pageSize: pageSize.value,
    sort: sort.value,
    order: order.value,
    q: filters.value.text.trim() || undefined,
    tag: filters.value.tag ?? undefined,
    origin: filters.value.origin ?? undefined,
    warnings: filters.value.warnings ?? undefined,
    trash: isTrash.value ? '1' : undefined,
  }))
  const queryKey = computed(() => JSON.stringify([projectId.value, query.value]))
  const hasFilters = computed(() => {
    const f = filters.value
    return f.text.trim() !== '' || f.tag !== null || f.origin !== null || f.warnings !== null
  })

  const list = useLatestPage<PathListItem, PathPage>({
    page,
    pageSize,
    fetchPage: (signal) => (projectId.value === null ? null : listPaths(projectId.value, query.value, signal)),
    onPage: (result) => {
      tags.value = result.tags
    },
  })
  const { items, total, isLoading, error, load } = list

  /** Opens another project's library: first page, no filters, not the trash. */
  function setProject(id: number | null): void {
    if (id === projectId.value) return
    projectId.value = id
    page.value = 1
    filters.value = { ...NO_FILTERS }
    isTrash.value = false
    items.value = []
    total.value = 0
    tags.value = []
    copyTargets.value = []
  }

  function setTableOptions(options: PathTableOptions): void {
    page.value = options.page
    pageSize.value = options.pageSize
    sort.value = options.sort
    order.value = options.order
  }

  /** Changes some filters (the name text is a case-insensitive substring), from the first page. */
  function setFilters(change: Partial<PathFilters>): void {
    const next = { ...filters.value, ...change }
    if (JSON.stringify(next) === JSON.stringify(filters.value)) return
    filters.value = next
    page.value = 1
  }

  function clearFilters(): void {
    setFilters(NO_FILTERS)
  }

  /** Switches between the library and its trash, from the first page. */
  function setTrash(trash: boolean): void {
    if (trash === isTrash.value) return
    isTrash.value = trash
    page.value = 1
  }

  function requireProject(): number {
    if (projectId.value === null) throw toApiRequestError(new Error('Open a project first.'))
    return projectId.value
  }

  async function afterChange<T>(change: Promise<T>): Promise<T> {
    const result = await change
    await load()
    return result
  }

  /** Adds tags to many paths; resolves to how many paths changed. */
  function tagPaths(ids: readonly number[], tagList: readonly string[]): Promise<number> {
    return afterChange(bulkPaths(requireProject(), { action: 'tag', ids: [...ids], tags: [...tagList] }))
  }

  function untagPaths(ids: readonly number[], tagList: readonly string[]): Promise<number> {
    return afterChange(bulkPaths(requireProject(), { action: 'untag', ids: [...ids], tags: [...tagList] }))
  }

  /** Moves paths to the trash, where editors can restore them for TRASH_DAYS days. */
  function trashPaths(ids: readonly number[]): Promise<number> {
    return afterChange(bulkPaths(requireProject(), { action: 'trash', ids: [...ids] }))
  }

  /** Copies paths (current revisions) into another project of the team. */
  function copyPaths(ids: readonly number[], targetProjectId: number): Promise<number> {
    return afterChange(bulkPaths(requireProject(), { action: 'copy', ids: [...ids], targetProjectId }))
  }

  /** Restores trashed paths one by one; the list reloads even when one of them fails. */
  async function untrashPaths(ids: readonly number[]): Promise<void> {
    try {
      for (const id of ids) await untrashPath(id)
    } finally {
      await load()
    }
  }

  /** Deletes one trashed path for good (owners). */
  function purgeFromTrash(id: number): Promise<void> {
    return afterChange(purgePath(id))
  }

  /** Deletes every trashed path of the project for good (owners); resolves to how many. */
  function emptyProjectTrash(): Promise<number> {
    return afterChange(emptyTrash(requireProject()))
  }

  /** Creates the paths chosen in an import preview, all or nothing. */
  function importChosen(input: ImportPaths): Promise<PathListItem[]> {
    return afterChange(importPaths(requireProject(), input))
  }

  /** Adds the paths of a bundle, with every revision, to this library. */
  function importProjectBundle(bundle: Bundle): Promise<PathListItem[]> {
    return afterChange(importBundle(requireProject(), bundle))
  }

  function exportPathsSvg(ids: readonly number[]): Promise<string> {
    return exportSvg(requireProject(), ids)
  }

  function exportPathsBundle(ids: readonly number[]): Promise<string> {
    return exportBundle(requireProject(), ids)
  }

  /** The other projects of the team, for "copy to another project". */
  async function loadCopyTargets(teamId: number): Promise<void> {
    isLoadingCopyTargets.value = true
    copyTargetsError.value = null
    try {
      const result = await listProjects(teamId, { page: 1, pageSize: COPY_TARGET_LIMIT, sort: 'name', order: 'asc' })
      copyTargets.value = result.items.filter((project) => project.id !== projectId.value)
      copyTargetsTotal.value = result.total
    } catch (cause) {
      copyTargets.value = []
      copyTargetsError.value = toApiRequestError(cause)
    } finally {
      isLoadingCopyTargets.value = false
    }
  }

  return {
    projectId: readonly(projectId),
    items: readonly(items),
    total: readonly(total),
    tags: readonly(tags),
    page: readonly(page),
    pageSize: readonly(pageSize),
    sort: readonly(sort),
    order: readonly(order),
    filters: readonly(filters),
    isTrash: readonly(isTrash),
    isLoading: readonly(isLoading),
    error: readonly(error),
    copyTargets: readonly(copyTargets),
    copyTargetsTotal: readonly(copyTargetsTotal),
    isLoadingCopyTargets: readonly(isLoadingCopyTargets),
    copyTargetsError: readonly(copyTargetsError),
    query,
    queryKey,
    hasFilters,
    load,
    setProject,
    setTableOptions,
    setFilters,
    clearFilters,
    setTrash,
    tagPaths,
    untagPaths,
    trashPaths,
    copyPaths,
    untrashPaths,
    purgeFromTrash,
    emptyProjectTrash,
    importChosen,
    importProjectBundle,
    exportPathsSvg,
    exportPathsBundle,
    loadCopyTargets,
  }
})
