import { defineStore } from 'pinia'
import { computed, ref, shallowRef } from 'vue'
import type { Check, CheckRun, NewCheck, NewSuite, RunDetail, RunSummary, Suite, UpdateCheck } from '../../shared/api'
import { toApiRequestError, type ApiRequestError } from '../api/http'
import * as api from '../api/suites'

/**
 * The Suites screen's server state: the project's suites, the chosen suite's checks and run
 * history, the run on display, and the trend of one check.
 */
export const useSuitesStore = defineStore('suites', () => {
  const projectId = ref<number | null>(null)
  const suites = shallowRef<readonly Suite[]>([])
  const suiteId = ref<number | null>(null)
  const checks = shallowRef<readonly Check[]>([])
  const runs = shallowRef<readonly RunSummary[]>([])
  const run = shallowRef<RunDetail | null>(null)
  const checkTrend = shallowRef<{ checkId: number; runs: readonly CheckRun[] } | null>(null)
  const isLoading = ref(false)
  const isRunning = ref(false)
  const error = shallowRef<ApiRequestError | null>(null)

  const suite = computed(() => suites.value.find((s) => s.id === suiteId.value) ?? null)

  async function guard<T>(work: () => Promise<T>): Promise<T | null> {
    error.value = null
    try {
      return await work()
    } catch (cause) {
      error.value = toApiRequestError(cause)
      return null
    }
  }

  async function load(id: number): Promise<void> {
    if (projectId.value !== id) {
      suites.value = []
      suiteId.value = null
      checks.value = []
      runs.value = []
      run.value = null
    }
    projectId.value = id
    isLoading.value = true
    await guard(async () => {
      suites.value = await api.listSuites(id)
      if (suiteId.value === null && suites.value.length > 0) await choose(suites.value[0].id)
    })
    isLoading.value = false
  }

  async function choose(id: number): Promise<void> {
    suiteId.value = id
    checkTrend.value = null
    await guard(async () => {
      const [c, r] = await Promise.all([api.listChecks(id), api.listRuns(id)])
      if (suiteId.value !== id) return
      checks.value = c
      runs.value = r.items
      run.value = r.items.length > 0 && (run.value === null || run.value.suiteId !== id) ? await api.getRun(r.items[0].id) : run.value
    })
  }

  async function openRun(runId: number): Promise<void> {
    const detail = await guard(() => api.getRun(runId))
    if (!detail) return
    if (detail.suiteId !== suiteId.value) await choose(detail.suiteId)
    run.value = detail
  }

  function replaceSuite(next: Suite): void {
    suites.value = suites.value.map((s) => (s.id === next.id ? next : s))
  }

  async function runNow(): Promise<RunDetail | null> {
    const id = suiteId.value
    if (id === null) return null
    isRunning.value = true
    const detail = await guard(() => api.runSuite(id))
    isRunning.value = false
    if (!detail) return null
    run.value = detail
    runs.value = [detail, ...runs.value.filter((r) => r.id !== detail.id)]
    const s = suites.value.find((x) => x.id === id)
    if (s) replaceSuite({ ...s, lastRun: detail })
    return detail
  }

  /** Creates a suite; throws for the dialog to show. */
  async function createSuite(input: NewSuite): Promise<Suite> {
    const created = await api.createSuite(projectId.value!, input)
    suites.value = [...suites.value, created]
    await choose(created.id)
    return created
  }

  async function removeSuite(id: number): Promise<void> {
    if ((await guard(() => api.deleteSuite(id))) === null && error.value) return
    suites.value = suites.value.filter((s) => s.id !== id)
    if (suiteId.value === id) {
      suiteId.value = null
      checks.value = []
      runs.value = []
      run.value = null
      if (suites.value.length > 0) await choose(suites.value[0].id)
    }
  }

  async function setWatching(watching: boolean): Promise<void> {
    const id = suiteId.value
    if (id === null) return
    const next = await guard(() => api.watchSuite(id, watching))
    if (next) replaceSuite(next)
  }

  /** Keeps hits as a check (from the canvas); throws for the dialog to show. */
  async function addCheck(targetSuiteId: number, input: NewCheck): Promise<Check> {
    const created = await api.createCheck(targetSuiteId, input)
    if (suiteId.value === targetSuiteId) checks.value = [...checks.value, created]
    const s = suites.value.find((x) => x.id === targetSuiteId)
    if (s) replaceSuite({ ...s, checkCount: s.checkCount + 1 })
    return created
  }

  async function changeCheck(checkId: number, patch: UpdateCheck): Promise<void> {
    const next = await guard(() => api.updateCheck(checkId, patch))
    if (next) checks.value = checks.value.map((c) => (c.id === checkId ? next : c))
  }

  async function removeCheck(checkId: number): Promise<void> {
    if ((await guard(() => api.deleteCheck(checkId))) === null && error.value) return
    checks.value = checks.value.filter((c) => c.id !== checkId)
  }

  /** One check (the canvas opens its case); null with `error` set when it cannot be read. */
  function fetchCheck(checkId: number): Promise<Check | null> {
    return guard(() => api.getCheck(checkId))
  }

  async function loadCheckTrend(checkId: number): Promise<void> {
    const page = await guard(() => api.listCheckRuns(checkId))
    if (page) checkTrend.value = { checkId, runs: page.items }
  }

  return {
    projectId, suites, suiteId, suite, checks, runs, run, checkTrend, isLoading, isRunning, error,
    load, choose, openRun, fetchCheck, runNow, createSuite, removeSuite, setWatching, addCheck, changeCheck, removeCheck, loadCheckTrend,
  }
})
