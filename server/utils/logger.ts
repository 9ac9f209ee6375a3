// The server's one logger: consola (what Nuxt and Nitro log with), one tag per part of the app,
// so a line says where it came from: `useLogger('outbox').warn(...)` prints `[outbox] ...`.
import { consola, type ConsolaInstance } from 'consola'

export function useLogger(tag: string): ConsolaInstance {
  return consola.withTag(tag)
}
