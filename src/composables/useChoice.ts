import { computed, shallowRef } from 'vue'

/** Which items of a preview list are ticked, by key; a new Set on every change so views update. */
export function useChoice<K>() {
  const chosen = shallowRef(new Set<K>())

  function isChosen(key: K): boolean {
    return chosen.value.has(key)
  }
  function toggle(key: K, on: boolean | null): void {
    const next = new Set(chosen.value)
    if (on) next.add(key)
    else next.delete(key)
    chosen.value = next
  }
  /** Ticks exactly these keys (none for an empty list). */
  function chooseOnly(keys: Iterable<K>): void {
    chosen.value = new Set(keys)
  }

  return { count: computed(() => chosen.value.size), isChosen, toggle, chooseOnly }
}
