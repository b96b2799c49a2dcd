import { defineStore } from 'pinia'
import { ref, shallowRef } from 'vue'
import type { NewProbeSet, ProbeSet, ProbeSetSummary } from '../../shared/api'
import { createProbeSet, deleteProbeSet, getProbeSet, listProbeSets } from '../api/probe-sets'
import { toApiRequestError, type ApiRequestError } from '../api/http'

/** The probe sets of the project on screen: saved arrangements of probes and sweeps over a path revision. */
export const useProbeSetsStore = defineStore('probeSets', () => {
  const projectId = ref<number | null>(null)
  const items = shallowRef<readonly ProbeSetSummary[]>([])
  const isLoading = ref(false)
  const error = ref<ApiRequestError | null>(null)

  async function load(id: number): Promise<void> {
    projectId.value = id
    isLoading.value = true
    error.value = null
    try {
      const list = await listProbeSets(id)
      if (projectId.value === id) items.value = list
    } catch (cause) {
      error.value = toApiRequestError(cause)
    } finally {
      isLoading.value = false
    }
  }

  async function fetchOne(id: number): Promise<ProbeSet | null> {
    error.value = null
    try {
      return await getProbeSet(id)
    } catch (cause) {
      error.value = toApiRequestError(cause)
      return null
    }
  }

  /** Saves a new set; throws the ApiRequestError so the dialog can show it next to its fields. */
  async function create(id: number, input: NewProbeSet): Promise<ProbeSet> {
    const created = await createProbeSet(id, input)
    await load(id)
    return created
  }

  async function remove(id: number): Promise<void> {
    error.value = null
    try {
      await deleteProbeSet(id)
      items.value = items.value.filter((s) => s.id !== id)
    } catch (cause) {
      error.value = toApiRequestError(cause)
    }
  }

  return { projectId, items, isLoading, error, load, fetchOne, create, remove }
})
