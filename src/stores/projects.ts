import { defineStore } from 'pinia'
import { computed, readonly, ref, shallowRef } from 'vue'
import type { CreateProject, Project, ProjectListQuery, ProjectPage, UpdateProject } from '../../shared/api'
import { useLatestPage } from '../composables/useLatestPage'
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
  const page = ref(1)
  const pageSize = ref<number>(PROJECT_PAGE_SIZES[0])
  const sort = ref<ProjectSortKey>('name')
  const order = ref<SortOrder>('asc')
  const filter = ref('')
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

  const list = useLatestPage<Project, ProjectPage>({
    page,
    pageSize,
    fetchPage: (signal) => (teamId.value === null ? null : listProjects(teamId.value, query.value, signal)),
  })
  const { items, total, isLoading, error, load } = list

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
