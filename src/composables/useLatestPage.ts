import { ref, shallowRef, type Ref } from 'vue'
import { toApiRequestError, type ApiRequestError } from '../api/http'

/** A page of a server-side list. */
export interface ServerPage<T> {
  items: T[]
  total: number
}

/**
 * One server-paged list whose answers may arrive out of order while someone types or pages
 * quickly: only the latest request counts, and the one before it is aborted. After a delete
 * or a narrower filter the page may lie past the end; then the last page is shown.
 */
export function useLatestPage<T, P extends ServerPage<T>>(options: {
  page: Ref<number>
  pageSize: Ref<number>
  /** The request for the current state, or null when there is nothing to list (no scope yet). */
  fetchPage: (signal: AbortSignal) => Promise<P> | null
  /** Extra fields of the latest answer, e.g. the tags of a library page. */
  onPage?: (page: P) => void
}) {
  const items = ref<T[]>([]) as Ref<T[]>
  const total = ref(0)
  const isLoading = ref(false)
  const error = shallowRef<ApiRequestError | null>(null)
  let latestRequest = 0
  let listAbort: AbortController | null = null

  function clear(): void {
    items.value = []
    total.value = 0
  }

  async function load(): Promise<void> {
    const ticket = ++latestRequest
    listAbort?.abort()
    const abort = new AbortController()
    const request = options.fetchPage(abort.signal)
    if (request === null) {
      clear()
      isLoading.value = false
      return
    }
    listAbort = abort
    isLoading.value = true
    error.value = null
    try {
      const result = await request
      if (ticket !== latestRequest) return
      items.value = result.items
      total.value = result.total
      options.onPage?.(result)
      const lastPage = Math.max(1, Math.ceil(result.total / options.pageSize.value))
      if (result.items.length === 0 && options.page.value > lastPage) options.page.value = lastPage
    } catch (cause) {
      if (ticket !== latestRequest) return
      error.value = toApiRequestError(cause)
      clear()
    } finally {
      if (ticket === latestRequest) isLoading.value = false
    }
  }

  return { items, total, isLoading, error, load, clear }
}
