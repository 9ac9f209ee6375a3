// Zod 4 probes whether it may compile validators with `new Function` the first time a schema is
// built; under our Content-Security-Policy (no 'unsafe-eval', server/plugins/security-headers.ts)
// that probe is a CSP violation in the browser. Jitless mode skips the probe and the compiling; the
// browser's validation of small forms does not need the speed. Set at module load, before any page
// chunk builds its schemas. The server keeps zod's compiled validators.
import { config } from 'zod'

config({ jitless: true })

export default defineNuxtPlugin(() => {})
