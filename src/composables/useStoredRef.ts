import { ref, watch, type Ref } from 'vue'

/** Reads a value kept in localStorage; `fallback` when absent, unreadable or rejected by `parse`. */
export function readStored<T>(key: string, parse: (raw: string) => T | undefined, fallback: T): T {
  try {
    const raw = globalThis.localStorage?.getItem(key)
    if (raw === null || raw === undefined) return fallback
    return parse(raw) ?? fallback
  } catch {
    // Storage can be blocked (privacy settings); the choice then lasts for this page only.
    return fallback
  }
}

function writeStored(key: string, value: string | null): void {
  try {
    if (value === null) globalThis.localStorage?.removeItem(key)
    else globalThis.localStorage?.setItem(key, value)
  } catch {
    // See readStored: not being able to persist a preference is not an error for the user.
  }
}

/**
 * A ref that starts from localStorage and writes every change back
 * (null removes the entry). `parse` returns undefined for a value it rejects.
 */
export function useStoredRef<T>(
  key: string,
  parse: (raw: string) => T | undefined,
  fallback: T,
  serialize: (value: T) => string | null = (value) => (value === null ? null : String(value)),
): Ref<T> {
  const value = ref(readStored(key, parse, fallback)) as Ref<T>
  watch(value, (next) => writeStored(key, serialize(next)), { flush: 'sync' })
  return value
}
