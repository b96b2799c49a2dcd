import { defineStore } from 'pinia'
import { ref, shallowRef } from 'vue'
import type { Audit, AuditSummary, NewAudit } from '../../shared/api'
import * as api from '../api/audits'
import { toApiRequestError, type ApiRequestError } from '../api/http'

/** How often a running audit's progress is read again, in milliseconds. */
export const AUDIT_POLL_MS = 1000

const RUNNING: readonly Audit['status'][] = ['queued', 'running', 'cancelling']

/** The project's audits, the one on display, and its live progress while it runs. */
export const useAuditsStore = defineStore('audits', () => {
  const projectId = ref<number | null>(null)
  const items = shallowRef<readonly AuditSummary[]>([])
  const current = shallowRef<Audit | null>(null)
  const isLoading = ref(false)
  const error = shallowRef<ApiRequestError | null>(null)
  let timer: ReturnType<typeof setTimeout> | null = null

  function stopPolling(): void {
    if (timer) clearTimeout(timer)
    timer = null
  }

  async function guard<T>(work: () => Promise<T>): Promise<T | null> {
    error.value = null
    try {
      return await work()
    } catch (cause) {
      error.value = toApiRequestError(cause)
      return null
    }
  }

  function poll(): void {
    stopPolling()
    const audit = current.value
    if (!audit || !RUNNING.includes(audit.status)) return
    timer = setTimeout(async () => {
      const next = await guard(() => api.getAudit(audit.id))
      if (next && current.value?.id === next.id) {
        current.value = next
        items.value = items.value.map((a) => (a.id === next.id ? next : a))
      }
      poll()
    }, AUDIT_POLL_MS)
  }

  async function load(id: number): Promise<void> {
    if (projectId.value !== id) {
      current.value = null
      items.value = []
    }
    projectId.value = id
    isLoading.value = true
    const list = await guard(() => api.listAudits(id))
    if (list) items.value = list
    isLoading.value = false
    if (!current.value && list && list.length > 0) await open(list[0].id)
  }

  async function open(auditId: number): Promise<void> {
    const audit = await guard(() => api.getAudit(auditId))
    if (!audit) return
    current.value = audit
    poll()
  }

  /** Starts an audit; throws for the dialog to show. */
  async function start(input: NewAudit): Promise<Audit> {
    const audit = await api.createAudit(projectId.value!, input)
    items.value = [audit, ...items.value]
    current.value = audit
    poll()
    return audit
  }

  async function cancel(): Promise<void> {
    const audit = current.value
    if (!audit) return
    const next = await guard(() => api.cancelAudit(audit.id))
    if (next) {
      current.value = next
      items.value = items.value.map((a) => (a.id === next.id ? next : a))
      poll()
    }
  }

  return { projectId, items, current, isLoading, error, load, open, start, cancel, stopPolling }
})
