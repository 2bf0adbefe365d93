/**
 * A result that belongs to its inputs, named by a key (the inputs as text): asked for again only
 * for a new key, and of several requests in flight only the newest one's answer is kept.
 */
import { ref, shallowRef } from 'vue'

export function useKeyedResult<T>() {
  const value = shallowRef<T | null>(null)
  /** The key of the inputs `value` belongs to. */
  const key = ref<string | null>(null)
  const running = ref(false)
  const failure = ref<string | null>(null)
  let requested: string | null = null

  async function fetch(wanted: string, work: () => Promise<T>): Promise<void> {
    if (wanted === key.value || wanted === requested) return
    requested = wanted
    running.value = true
    try {
      const result = await work()
      if (requested !== wanted) return
      value.value = result
      key.value = wanted
      failure.value = null
    } catch (error) {
      if (requested === wanted) failure.value = error instanceof Error ? error.message : String(error)
    } finally {
      if (requested === wanted) {
        requested = null
        running.value = false
      }
    }
  }

  return { value, key, running, failure, fetch }
}
