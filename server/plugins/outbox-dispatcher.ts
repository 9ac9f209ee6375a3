// The outbox dispatcher loop of this server process. Off with NUXT_OUTBOX_DISPATCHER=false. Several
// processes may run it at once: rows are claimed with FOR UPDATE SKIP LOCKED, so each goes out once.
import nodemailer from 'nodemailer'
import { useDb } from '../utils/db'
import { useLogger } from '../utils/logger'
import { useVisitLinkSecret } from '../utils/visit-link-secret'
import { dispatchOnce, type DispatchSettings } from '../services/mail/dispatcher'

export default defineNitroPlugin((nitroApp) => {
  const config = useRuntimeConfig()
  const outbox = config.outbox
  if (String(outbox.dispatcher) === 'false') return

  const smtp = config.smtp
  const transporter = nodemailer.createTransport({
    host: smtp.host, port: Number(smtp.port), secure: String(smtp.secure) === 'true',
    ...(smtp.user ? { auth: { user: smtp.user, pass: smtp.password } } : {}),
    connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 20_000,
  })
  const settings: DispatchSettings = {
    batchSize: Number(outbox.batchSize), leaseSeconds: Number(outbox.leaseSeconds), lane: String(outbox.lane ?? ''),
    retry: { baseSeconds: Number(outbox.retryBaseSeconds), maxSeconds: Number(outbox.retryMaxSeconds), maxAttempts: Number(outbox.maxAttempts) },
    from: String(smtp.from ?? ''), publicUrl: String(config.mail.publicUrl), linkSecret: useVisitLinkSecret(),
    replyAddress: String(config.mail.replyAddress ?? ''),
  }
  const pollMs = Math.max(50, Number(outbox.pollMs))
  let stopped = false
  let timer: ReturnType<typeof setTimeout> | undefined

  async function loop(): Promise<void> {
    if (stopped) return
    let busy = false
    try {
      const round = await dispatchOnce(useDb(), transporter, settings)
      busy = round.claimed === settings.batchSize
    } catch (error) {
      useLogger('outbox').error('dispatcher:', error instanceof Error ? error.message : error)
    }
    // A full batch: more may be due, go again at once.
    if (!stopped) timer = setTimeout(loop, busy ? 0 : pollMs)
  }

  timer = setTimeout(loop, pollMs)
  nitroApp.hooks.hook('close', () => {
    stopped = true
    if (timer) clearTimeout(timer)
    transporter.close()
  })
})
