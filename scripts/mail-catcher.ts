// The local stand-in for a hosted e-mail service: accepts SMTP on loopback and writes each
// message it receives, untouched, as an .eml file (written to a temp name, then renamed, so a
// reader never sees half a message). Mail for a site's calendar reply address (NUXT_MAIL_REPLY_ADDRESS,
// `replies+{site}@…`) is also posted to the app's inbound endpoint (INBOUND_MAIL_URL), raw, signed
// with NUXT_MAIL_INBOUND_SECRET, as a hosted inbound-mail service posts to its webhook
// (server/utils/inbound-signature.ts). The SMTP answer waits for that post.
// Like a sending service with idempotent submission, it keeps one copy per Message-ID: a message
// submitted again with an ID it already holds (the outbox gives each row one ID, so a dispatcher
// that died after the server took a message but before recording it sends the same ID again) is
// accepted and not kept twice; each such repeat is noted in .duplicates, one Message-ID a line.
import { appendFileSync, existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { randomUUID } from 'node:crypto'
import { SMTPServer } from 'smtp-server'
import { siteOfReplyAddress } from '../shared/domain/reply-address'
import { INBOUND_HEADERS, inboundSignature } from '../server/utils/inbound-signature'

const host = process.env.SMTP_HOST ?? '127.0.0.1'
const port = Number(process.env.SMTP_PORT ?? 1025)
const mailDir = process.env.MAIL_DIR ?? join(process.cwd(), '.data', 'mail')
const replyTemplate = process.env.NUXT_MAIL_REPLY_ADDRESS ?? ''
const inboundUrl = process.env.INBOUND_MAIL_URL ?? `http://127.0.0.1:${process.env.PORT ?? 3000}/api/inbound/mail`
const inboundSecret = process.env.NUXT_MAIL_INBOUND_SECRET ?? ''
mkdirSync(mailDir, { recursive: true })

async function forward(raw: Buffer, recipient: string): Promise<void> {
  const id = randomUUID()
  const timestamp = String(Math.floor(Date.now() / 1000))
  try {
    const response = await fetch(inboundUrl, {
      method: 'POST',
      headers: {
        'content-type': 'message/rfc822',
        [INBOUND_HEADERS.id]: id,
        [INBOUND_HEADERS.timestamp]: timestamp,
        [INBOUND_HEADERS.signature]: inboundSignature(inboundSecret, id, timestamp, raw),
        [INBOUND_HEADERS.recipient]: recipient,
      },
      body: new Uint8Array(raw),
    })
    console.log(`mail catcher: reply for ${recipient} posted to ${inboundUrl}: ${response.status}`)
  } catch (error) {
    console.error(`mail catcher: could not post the reply for ${recipient} to ${inboundUrl}:`, error instanceof Error ? error.message : error)
  }
}

const idsFile = join(mailDir, '.message-ids')
const kept = new Set(existsSync(idsFile) ? readFileSync(idsFile, 'utf8').split('\n').filter(Boolean) : [])

function messageIdOf(raw: Buffer): string | null {
  const end = raw.indexOf('\r\n\r\n')
  const head = raw.subarray(0, end === -1 ? raw.length : end).toString('utf8')
  return /^message-id:[ \t]*(<[^>\r\n]+>)/im.exec(head)?.[1] ?? null
}

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  logger: false,
  onData(stream, session, callback) {
    const chunks: Buffer[] = []
    stream.on('data', (chunk: Buffer) => chunks.push(chunk))
    stream.on('end', () => {
      const raw = Buffer.concat(chunks)
      const messageId = messageIdOf(raw)
      if (messageId && kept.has(messageId)) {
        appendFileSync(join(mailDir, '.duplicates'), `${messageId}\n`)
        return callback()
      }
      const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${randomUUID()}.eml`
      const temp = join(mailDir, `.${name}.part`)
      writeFileSync(temp, raw)
      renameSync(temp, join(mailDir, name))
      if (messageId) {
        kept.add(messageId)
        appendFileSync(idsFile, `${messageId}\n`)
      }
      const replies = session.envelope.rcptTo.map((to) => to.address).filter((address) => siteOfReplyAddress(replyTemplate, address) !== null)
      Promise.all(replies.map((address) => forward(raw, address))).then(() => callback(), () => callback())
    })
  },
})

server.on('error', (error) => console.error('mail catcher:', error.message))
server.listen(port, host, () => console.log(`mail catcher on ${host}:${port} -> ${mailDir}; replies -> ${inboundUrl}`))

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => server.close(() => process.exit(0)))
}
