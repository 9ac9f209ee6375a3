// At start-up in production: a warning when patient links would point at a loopback or plain-HTTP
// address (server/utils/public-url.ts). Development and the local setup use http://127.0.0.1 on purpose.
import { publicUrlProblem } from '../utils/public-url'
import { useLogger } from '../utils/logger'

export default defineNitroPlugin(() => {
  if (import.meta.dev || process.env.NODE_ENV !== 'production') return
  const problem = publicUrlProblem(String(useRuntimeConfig().mail.publicUrl ?? ''))
  if (problem) useLogger('mail').warn(problem)
})
