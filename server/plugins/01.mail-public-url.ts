// At start-up in production: a warning when patient links would point at a loopback or plain-HTTP
// address (server/utils/public-url.ts). `nuxt dev` stays quiet; a built server (what `npm start` and the
// tests run) always checks, so the local setup's http://127.0.0.1 prints the warning too, on purpose.
import { publicUrlProblem } from '../utils/public-url'
import { useLogger } from '../utils/logger'

export default defineNitroPlugin(() => {
  if (import.meta.dev) return
  const problem = publicUrlProblem(String(useRuntimeConfig().mail.publicUrl ?? ''))
  if (problem) useLogger('mail').warn(problem)
})
