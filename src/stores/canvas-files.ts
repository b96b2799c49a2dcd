import { defineStore } from 'pinia'
import { ref } from 'vue'
import { addRevision, createPath, getPath, getRevision } from '../api/library'
import { ApiRequestError, toApiRequestError } from '../api/http'
import { serializeEditPath } from '../canvas/edit-path'
import { useCanvasStore } from './canvas'

/**
 * The canvas's traffic with the library: opening paths (or an older revision) on the sheet
 * and saving an edit as a new revision, or a path drawn here as a new path.
 */
export const useCanvasFilesStore = defineStore('canvasFiles', () => {
  const canvas = useCanvasStore()
  /** The project whose paths are on the sheet; the sheet survives leaving the Canvas tab and coming back. */
  const projectId = ref<number | null>(null)
  const isLoading = ref(false)
  const isSaving = ref(false)
  const error = ref<ApiRequestError | null>(null)

  /**
   * Opens every id that is not on the sheet yet; resolves to the keys of those on the sheet,
   * in the given order. One that cannot be opened (gone, another team's) is skipped and
   * named in `error`; the others still open.
   */
  async function openPaths(ids: readonly number[]): Promise<string[]> {
    isLoading.value = true
    error.value = null
    const keys: string[] = []
    const failed: string[] = []
    let lastError: ApiRequestError | null = null
    for (const id of ids) {
      const key = `path-${id}`
      if (canvas.sheets.some((s) => s.key === key)) {
        keys.push(key)
        continue
      }
      try {
        keys.push(canvas.openPath(await getPath(id)))
      } catch (cause) {
        lastError = toApiRequestError(cause)
        failed.push(`#${id}`)
      }
    }
    if (lastError) {
      const what = failed.length === 1 ? `Path ${failed[0]} could not be opened` : `Paths ${failed.join(', ')} could not be opened`
      error.value = new ApiRequestError(lastError.status, lastError.code, `${what}: ${lastError.message}`)
    }
    isLoading.value = false
    return keys
  }

  /** Puts revision `number` of a path on the sheet (replacing the path's sheet if open and clean). */
  async function openRevision(pathId: number, number: number): Promise<string | null> {
    isLoading.value = true
    error.value = null
    try {
      const [detail, revision] = await Promise.all([getPath(pathId), getRevision(pathId, number)])
      const key = `path-${pathId}`
      if (canvas.sheets.some((s) => s.key === key)) {
        if (canvas.isDirty(key)) throw new Error('The path has unsaved edits on the sheet: save or undo them first.')
        canvas.closePath(key)
      }
      return canvas.openPath({ ...detail, data: revision.data, revision: revision.number, diagnostics: revision.diagnostics })
    } catch (cause) {
      error.value = toApiRequestError(cause)
      return null
    } finally {
      isLoading.value = false
    }
  }

  /**
   * Puts a path on the sheet as a case shows it: `revision` itself, or the path's latest one.
   * An open sheet of that path with unsaved edits is kept as it is. Resolves to its key.
   */
  async function openCase(pathId: number, revision: number | 'latest'): Promise<string | null> {
    const [key] = await openPaths([pathId])
    if (!key) return null
    const wanted = revision === 'latest' ? ((await getPath(pathId).catch(() => null))?.revision ?? null) : revision
    const sheet = canvas.sheets.find((s) => s.key === key)
    if (wanted !== null && sheet && sheet.revision !== wanted && !canvas.isDirty(key)) return (await openRevision(pathId, wanted)) ?? key
    return key
  }

  /** Saves a sheet: a new revision of its path, or a new path for one drawn here. Resolves to the sheet's key. */
  async function save(projectId: number, key: string, message: string, name: string): Promise<string | null> {
    const sheet = canvas.sheets.find((s) => s.key === key)
    if (!sheet) return null
    isSaving.value = true
    error.value = null
    try {
      const data = serializeEditPath(sheet.edit)
      const detail = sheet.pathId === null
        ? await createPath(projectId, { name, data, fillRule: sheet.fillRule, units: sheet.units, message })
        : await addRevision(sheet.pathId, data, message)
      return canvas.markSaved(key, detail)
    } catch (cause) {
      error.value = toApiRequestError(cause)
      return null
    } finally {
      isSaving.value = false
    }
  }

  function clearError(): void {
    error.value = null
  }

  return { projectId, isLoading, isSaving, error, openPaths, openCase, openRevision, save, clearError }
})
