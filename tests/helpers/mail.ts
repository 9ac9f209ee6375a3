// Reading what really arrived over SMTP: the shared catcher's .eml files (MAIL_DIR), or a catcher
// of the test's own (smtp-server in this process) that can be stopped and started again.
import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { simpleParser, type ParsedMail, type Attachment } from 'mailparser'
import { SMTPServer } from 'smtp-server'
import ICAL from 'ical.js'
import { testDb } from './db'

export const MAIL_DIR = process.env.MAIL_DIR ?? join(process.cwd(), '.data', 'mail')

export interface Arrived {
  raw: string
  parsed: ParsedMail
}

const parsedCache = new Map<string, Arrived>()

/** Messages in the shared catcher whose raw text contains `needle` (the patient's unique address). */
export async function mailsContaining(needle: string): Promise<Arrived[]> {
  const found: Arrived[] = []
  for (const name of readdirSync(MAIL_DIR).filter((file) => file.endsWith('.eml')).sort()) {
    const cached = parsedCache.get(name)
    if (cached) {
      if (cached.raw.includes(needle)) found.push(cached)
      continue
    }
    const raw = readFileSync(join(MAIL_DIR, name), 'utf8')
    if (!raw.includes(needle)) continue
    const arrived = { raw, parsed: await simpleParser(raw) }
    parsedCache.set(name, arrived)
    found.push(arrived)
  }
  return found
}

/**
 * Waits until the message for this outbox row has arrived in the shared catcher. Patients' messages
 * carry no internal headers: the row's Message-ID (kept in the database) finds it.
 */
export async function waitForOutboxMail(needle: string, outboxId: number, timeoutMs = 20_000): Promise<Arrived> {
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    const row = await testDb()('outbox').where({ id: outboxId }).first('message_id')
    if (row?.message_id) {
      const match = (await mailsContaining(needle)).find((mail) => mail.parsed.messageId === row.message_id)
      if (match) return match
    }
    await new Promise((wait) => setTimeout(wait, 200))
  }
  throw new Error(`no e-mail for outbox row ${outboxId} (${needle}) within ${timeoutMs} ms`)
}

/** How many times each outbox row arrived, by the Message-ID each row keeps. */
export async function deliveriesPerRow(received: Arrived[]): Promise<Map<number, number>> {
  const ids = received.map((mail) => mail.parsed.messageId).filter((id): id is string => Boolean(id))
  const rows: Array<{ id: number; message_id: string }> = ids.length ? await testDb()('outbox').whereIn('message_id', [...new Set(ids)]).select('id', 'message_id') : []
  const rowOf = new Map(rows.map((row) => [row.message_id, row.id]))
  const counts = new Map<number, number>()
  for (const id of ids) {
    const rowId = rowOf.get(id)
    if (rowId !== undefined) counts.set(rowId, (counts.get(rowId) ?? 0) + 1)
  }
  return counts
}

/** The text/calendar part: nodemailer's icalEvent is an alternative that mailparser lists with attachments. */
export function calendarPart(mail: Arrived): Attachment {
  const part = mail.parsed.attachments.find((attachment) => attachment.contentType === 'text/calendar')
  if (!part) throw new Error('no text/calendar part')
  return part
}

/** The `method` parameter of the calendar part's Content-Type (RFC 6047 §2.4). */
export function calendarMethodParam(mail: Arrived): string | undefined {
  const match = /Content-Type:\s*text\/calendar;[^\r\n]*(?:\r?\n[ \t][^\r\n]*)*/i.exec(mail.raw)
  if (!match) return undefined
  return /method=("?)([A-Z-]+)\1/i.exec(match[0])?.[2]?.toUpperCase()
}

export function parseCalendar(text: string): ICAL.Component {
  return new ICAL.Component(ICAL.parse(text))
}

export function veventOf(calendar: ICAL.Component): ICAL.Component {
  const vevent = calendar.getFirstSubcomponent('vevent')
  if (!vevent) throw new Error('no VEVENT')
  return vevent
}

/** The first link to the patient's visit page in the text part. */
export function visitLinkOf(mail: Arrived): string {
  const link = /https?:\/\/\S+\/visit\/[^\s"<>]+/.exec(mail.parsed.text ?? '')?.[0]
  if (!link) throw new Error('no visit link in the message')
  return link
}

export interface OwnCatcher {
  port: number
  received: Arrived[]
  start: () => Promise<void>
  stop: () => Promise<void>
}

/** An SMTP catcher of the test's own on `port`, not listening until start(). */
export function ownCatcher(port: number): OwnCatcher {
  let server: SMTPServer | undefined
  const received: Arrived[] = []
  return {
    port,
    received,
    start: () => new Promise((done, fail) => {
      server = new SMTPServer({
        authOptional: true, disabledCommands: ['STARTTLS'], logger: false,
        onData(stream, _session, callback) {
          const chunks: Buffer[] = []
          stream.on('data', (chunk: Buffer) => chunks.push(chunk))
          stream.on('end', () => {
            const raw = Buffer.concat(chunks).toString('utf8')
            simpleParser(raw).then((parsed) => { received.push({ raw, parsed }); callback() }, callback)
          })
        },
      })
      server.once('error', fail)
      server.listen(port, '127.0.0.1', () => done())
    }),
    stop: () => new Promise((done) => {
      if (!server) return done()
      server.close(() => done())
      server = undefined
    }),
  }
}

/** Reads until `ok` holds (for setup code, where expect.poll is not allowed); throws after the timeout. */
export async function pollUntil<T>(read: () => Promise<T>, ok: (value: T) => boolean, timeoutMs = 20_000): Promise<T> {
  const deadline = Date.now() + timeoutMs
  for (;;) {
    const value = await read()
    if (ok(value)) return value
    if (Date.now() > deadline) throw new Error(`condition not met within ${timeoutMs} ms`)
    await new Promise((wait) => setTimeout(wait, 200))
  }
}

/** A JSON column as stored (mysql2 may hand it back parsed or as text). */
export function jsonOf(value: unknown): Record<string, unknown> {
  return typeof value === 'string' ? JSON.parse(value) : (value as Record<string, unknown>)
}
