// Runs first: checks the runtime settings once, before the server answers anything. A wrong NUXT_*
// value stops the process with the variable's name (what each accepts: server/utils/runtime-config.ts).
import { runtimeConfigProblems } from '../utils/runtime-config'
import { useLogger } from '../utils/logger'

export default defineNitroPlugin(() => {
  const problems = runtimeConfigProblems(useRuntimeConfig())
  if (problems.length === 0) return
  useLogger('config').error(`Cuspline cannot start, fix these settings (see .env.example):\n${problems.map((line) => `  ${line}`).join('\n')}`)
  process.exit(1)
})
