import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import type { ActivityAction, ActivityEntry, ActivityPage, ActivityTargetType } from '../../shared/api'
import { listProjectActivity } from '../api/activity'
import { useLatestPage } from '../composables/useLatestPage'

export const ACTIVITY_PAGE_SIZES = [10, 25, 50, 100] as const

/** What the filter row narrows the log to; null (or '') means "any". */
export interface ActivityFilters {
  actor: number | null
  action: ActivityAction | null
  targetType: ActivityTargetType | null
  /** Whole days, YYYY-MM-DD, both included. */
  from: string
  to: string
}

const NO_FILTERS: ActivityFilters = { actor: null, action: null, targetType: null, from: '', to: '' }

/** The open project's activity log as the server filters and pages it. */
export const useActivityStore = defineStore('activity', () => {
  const projectId = ref<number | null>(null)
  const page = ref(1)
  const pageSize = ref<number>(ACTIVITY_PAGE_SIZES[1])
  const filters = ref<ActivityFilters>({ ...NO_FILTERS })
  const people = ref<ActivityPage['people']>([])

  const list = useLatestPage<ActivityEntry, ActivityPage>({
    page,
    pageSize,
    fetchPage: (signal) => {
      if (projectId.value === null) return null
      const f = filters.value
      return listProjectActivity(projectId.value, {
        page: page.value, pageSize: pageSize.value,
        actor: f.actor ?? undefined, action: f.action ?? undefined, targetType: f.targetType ?? undefined,
        from: f.from || undefined, to: f.to || undefined,
      }, signal)
    },
    onPage: (result) => { people.value = result.people },
  })

  /** Changes whenever the server must be asked again. */
  const queryKey = computed(() => JSON.stringify([projectId.value, page.value, pageSize.value, filters.value]))
  const hasFilters = computed(() => JSON.stringify(filters.value) !== JSON.stringify(NO_FILTERS))

  function setProject(id: number): void {
    if (projectId.value === id) return
    projectId.value = id
    page.value = 1
    filters.value = { ...NO_FILTERS }
    people.value = []
    list.clear()
  }
  /** Narrows the log; back to the first page. */
  function setFilters(change: Partial<ActivityFilters>): void {
    filters.value = { ...filters.value, ...change }
    page.value = 1
  }
  function clearFilters(): void {
    setFilters({ ...NO_FILTERS })
  }
  function setPaging(nextPage: number, nextSize: number): void {
    if (nextSize !== pageSize.value) page.value = 1
    else page.value = nextPage
    pageSize.value = nextSize
  }

  return {
    projectId, page, pageSize, filters, people, queryKey, hasFilters,
    items: list.items, total: list.total, isLoading: list.isLoading, error: list.error, load: list.load,
    setProject, setFilters, clearFilters, setPaging,
  }
})
