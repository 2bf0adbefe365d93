/** Milliseconds from a monotonic clock where the runtime has one (browsers, Node), else Date.now(). */
const monotonic = (globalThis as { performance?: { now(): number } }).performance

export function nowMs(): number {
  return monotonic ? monotonic.now() : Date.now()
}
