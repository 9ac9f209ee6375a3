// The local stand-in for a hosted e-mail service: accepts SMTP on loopback and writes each
// message it receives, untouched, as an .eml file (written to a temp name, then renamed, so a
// reader never sees half a message).
import { mkdirSync, renameSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { randomUUID } from 'node:crypto'
import { SMTPServer } from 'smtp-server'

const host = process.env.SMTP_HOST ?? '127.0.0.1'
const port = Number(process.env.SMTP_PORT ?? 1025)
const mailDir = process.env.MAIL_DIR ?? join(process.cwd(), '.data', 'mail')
mkdirSync(mailDir, { recursive: true })

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  logger: false,
  onData(stream, session, callback) {
    const chunks: Buffer[] = []
    stream.on('data', (chunk: Buffer) => chunks.push(chunk))
    stream.on('end', () => {
      const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${randomUUID()}.eml`
      const temp = join(mailDir, `.${name}.part`)
      writeFileSync(temp, Buffer.concat(chunks))
      renameSync(temp, join(mailDir, name))
      callback()
    })
  },
})

server.on('error', (error) => console.error('mail catcher:', error.message))
server.listen(port, host, () => console.log(`mail catcher on ${host}:${port} -> ${mailDir}`))

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => server.close(() => process.exit(0)))
}
