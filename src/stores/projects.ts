import { defineStore } from 'pinia'
import { computed, readonly, ref, shallowRef } from 'vue'
import type { CreateProject, Project, ProjectListQuery, UpdateProject } from '../../shared/api'
import { createProject, deleteProject, getProject, listProjects, updateProject } from '../api/projects'
import { toApiRequestError, type ApiRequestError } from '../api/http'

export type ProjectSortKey = ProjectListQuery['sort']
export type SortOrder = ProjectListQuery['order']

export const PROJECT_PAGE_SIZES = [10, 25, 50, 100] as const

/** Table state from the data table: page, rows per page and the one sorted column. */
export interface ProjectTableOptions {
  page: number
  pageSize: number
  sort: ProjectSortKey
  order: SortOrder
}

/**
 * A team's projects as the server pages, sorts and filters them, plus the one project
 * that is open. Create, rename and remove reject with an ApiRequestError for the dialog
 * that asked; the list then reloads.
 */
export const useProjectsStore = defineStore('projects', () => {
  const teamId = ref<number | null>(null)
  const items = ref<Project[]>([])
  const total = ref(0)
  const page = ref(1)
  const pageSize = ref<number>(PROJECT_PAGE_SIZES[0])
  const sort = ref<ProjectSortKey>('name')
  const order = ref<SortOrder>('asc')
  const filter = ref('')
  const isLoading = ref(false)
  const error = shallowRef<ApiRequestError | null>(null)

  const current = ref<Project | null>(null)
  const isLoadingCurrent = ref(false)
  const currentError = shallowRef<ApiRequestError | null>(null)

  /** The request the list shows; a view reloads whenever it changes. */
  const query = computed<ProjectListQuery>(() => ({
    page: page.value,
    pageSize: pageSize.value,
    sort: sort.value,
    order: order.value,
    q: filter.value.trim() || undefined,
  }))
  const queryKey = computed(() => JSON.stringify([teamId.value, query.value]))

  // Answers may arrive out of order while someone types or pages quickly: only the latest counts.
  let latestListRequest = 0
  let listAbort: AbortController | null = null

  async function load(): Promise<void> {
    const ticket = ++latestListRequest
    listAbort?.abort()
    if (teamId.value === null) {
      items.value = []
      total.value = 0
      isLoading.value = false
      return
    }
    const abort = new AbortController()
    listAbort = abort
    isLoading.value = true
    error.value = null
    try {
      const result = await listProjects(teamId.value, query.value, abort.signal)
      if (ticket !== latestListRequest) return
      items.value = result.items
      total.value = result.total
      const lastPage = Math.max(1, Math.ceil(result.total / pageSize.value))
      // After a delete or a narrower filter the page may lie past the end: show the last one.
      if (result.items.length === 0 && page.value > lastPage) page.value = lastPage
    } catch (cause) {
      if (ticket !== latestListRequest) return
      error.value = toApiRequestError(cause)
      items.value = []
      total.value = 0
    } finally {
      if (ticket === latestListRequest) isLoading.value = false
    }
  }

  /** Switches to another team's projects, from the first page. */
  function setTeam(id: number | null): void {
    if (id === teamId.value) return
    teamId.value = id
    page.value = 1
    items.value = []
    total.value = 0
  }

  function setTableOptions(options: ProjectTableOptions): void {
    page.value = options.page
    pageSize.value = options.pageSize
    sort.value = options.sort
    order.value = options.order
  }

  /** Filters by name (case-insensitive substring on the server), from the first page. */
  function setFilter(text: string): void {
    if (text === filter.value) return
    filter.value = text
    page.value = 1
  }

  async function create(input: CreateProject): Promise<Project> {
    if (teamId.value === null) throw toApiRequestError(new Error('Choose a team first.'))
    const project = await createProject(teamId.value, input)
    await load()
    return project
  }

  async function rename(projectId: number, patch: UpdateProject): Promise<Project> {
    const project = await updateProject(projectId, patch)
    if (current.value?.id === projectId) current.value = project
    await load()
    return project
  }

  async function remove(projectId: number): Promise<void> {
    await deleteProject(projectId)
    if (current.value?.id === projectId) current.value = null
    await load()
  }

  /** Opens one project (the project screen and its tabs read `current`). */
  async function loadProject(projectId: number): Promise<void> {
    if (current.value?.id !== projectId) current.value = null
    isLoadingCurrent.value = true
    currentError.value = null
    try {
      current.value = await getProject(projectId)
    } catch (cause) {
      current.value = null
      currentError.value = toApiRequestError(cause)
    } finally {
      isLoadingCurrent.value = false
    }
  }

  return {
    teamId: readonly(teamId),
    items: readonly(items),
    total: readonly(total),
    page: readonly(page),
    pageSize: readonly(pageSize),
    sort: readonly(sort),
    order: readonly(order),
    filter: readonly(filter),
    isLoading: readonly(isLoading),
    error: readonly(error),
    current: readonly(current),
    isLoadingCurrent: readonly(isLoadingCurrent),
    currentError: readonly(currentError),
    query,
    queryKey,
    load,
    setTeam,
    setTableOptions,
    setFilter,
    create,
    rename,
    remove,
    loadProject,
  }
})
