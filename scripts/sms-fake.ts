// The local stand-in for the hosted SMS service (Twilio's Programmable Messaging REST API, the part
// the `twilio` SDK calls for texts): create and fetch a message, with the account's Basic auth.
// Each message is saved as JSON under .data/sms/ (written to a temp name, then renamed). After a
// create it calls the message's StatusCallback URL, signed as the real service signs
// (X-Twilio-Signature, made with the SDK's own getExpectedTwilioSignature and the account's auth
// token): queued → sent → delivered, or failed / undelivered for the reserved test numbers below.
// POST /_fake/inbound delivers a reply from a patient to the app's inbound webhook, signed the same
// way; GET /_fake/messages lists what it holds (tests read it). What it does not imitate: README.
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http'
import { mkdirSync, readdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { randomBytes } from 'node:crypto'
import twilio from 'twilio'

const host = process.env.SMS_FAKE_HOST ?? '127.0.0.1'
const port = Number(process.env.SMS_FAKE_PORT ?? 4010)
const smsDir = process.env.SMS_DIR ?? join(process.cwd(), '.data', 'sms')
const accountSid = process.env.SMS_FAKE_ACCOUNT_SID ?? ''
const authToken = process.env.SMS_FAKE_AUTH_TOKEN ?? ''
/** Milliseconds between two status callbacks of one message. */
const stepMs = Number(process.env.SMS_FAKE_STEP_MS ?? 150)
mkdirSync(smsDir, { recursive: true })

/** Reserved test numbers (the fictional 555-01xx range): any area code, these line numbers. */
const FAILS = /^\+1\d{3}5550199$/ // failed, 30008 "Unknown error"
const UNDELIVERED = /^\+1\d{3}5550198$/ // undelivered, 30003 "Unreachable destination handset"
const E164 = /^\+[1-9]\d{6,14}$/
const API = '/2010-04-01'

interface StoredMessage {
  sid: string
  account_sid: string
  api_version: '2010-04-01'
  direction: 'outbound-api' | 'inbound'
  from: string
  to: string
  body: string
  status: string
  error_code: number | null
  error_message: string | null
  num_segments: string
  num_media: '0'
  messaging_service_sid: string | null
  price: null
  price_unit: 'USD'
  date_created: string
  date_updated: string
  date_sent: string | null
  uri: string
  subresource_uris: { media: string }
  /** The fake's own notes (not in the real resource): where the callbacks went and how they were answered. */
  fake: { statusCallback: string | null; callbacks: Array<{ status: string; answer: number | string }>; inboundUrl?: string; inboundAnswer?: number | string }
}

const messages = new Map<string, StoredMessage>()
// Messages kept from earlier runs stay fetchable.
for (const name of readdirSync(smsDir).filter((file) => file.endsWith('.json'))) {
  try {
    const message = JSON.parse(readFileSync(join(smsDir, name), 'utf8')) as StoredMessage
    messages.set(message.sid, message)
  } catch {
    // a file that is not ours
  }
}

function save(message: StoredMessage): void {
  const name = `${message.sid}.json`
  const temp = join(smsDir, `.${name}.part`)
  writeFileSync(temp, JSON.stringify(message, null, 2))
  renameSync(temp, join(smsDir, name))
}

const rfc2822 = (date = new Date()) => date.toUTCString().replace('GMT', '+0000')
const newSid = (prefix: string) => `${prefix}${randomBytes(16).toString('hex')}`

function send(res: ServerResponse, status: number, body: unknown, type = 'application/json'): void {
  res.writeHead(status, { 'Content-Type': type })
  res.end(typeof body === 'string' ? body : JSON.stringify(body))
}

/** The service's error shape (code, message, more_info, status). */
function apiError(res: ServerResponse, status: number, code: number, message: string): void {
  send(res, status, { code, message, more_info: `https://www.twilio.com/docs/errors/${code}`, status })
}

async function readBody(req: IncomingMessage): Promise<string> {
  const chunks: Buffer[] = []
  let size = 0
  for await (const chunk of req) {
    size += (chunk as Buffer).length
    if (size > 64 * 1024) throw new Error('body too large')
    chunks.push(chunk as Buffer)
  }
  return Buffer.concat(chunks).toString('utf8')
}

function formParams(text: string): Record<string, string> {
  return Object.fromEntries(new URLSearchParams(text))
}

function authorised(req: IncomingMessage, sid: string): boolean {
  const header = req.headers.authorization ?? ''
  if (!header.startsWith('Basic ')) return false
  const [user, password] = Buffer.from(header.slice(6), 'base64').toString('utf8').split(':')
  return user === accountSid && password === authToken && sid === accountSid
}

/** POSTs form params to a webhook URL, signed as the real service signs (URL + sorted params, HMAC-SHA1, base64). */
async function postSigned(url: string, params: Record<string, string>): Promise<{ status: number | string; text: string }> {
  const signature = twilio.getExpectedTwilioSignature(authToken, url, params)
  try {
    const response = await fetch(url, {
      method: 'POST',
      headers: { 'Content-Type': 'application/x-www-form-urlencoded', 'X-Twilio-Signature': signature, 'User-Agent': 'TwilioProxy/1.1' },
      body: new URLSearchParams(params).toString(),
      signal: AbortSignal.timeout(15_000),
    })
    return { status: response.status, text: await response.text() }
  } catch (error) {
    return { status: error instanceof Error ? error.message : String(error), text: '' }
  }
}

function finalStatusOf(to: string): { status: string; code: number | null; message: string | null } {
  if (FAILS.test(to)) return { status: 'failed', code: 30008, message: 'Unknown error' }
  if (UNDELIVERED.test(to)) return { status: 'undelivered', code: 30003, message: 'Unreachable destination handset' }
  return { status: 'delivered', code: null, message: null }
}

async function walkStatuses(message: StoredMessage): Promise<void> {
  const final = finalStatusOf(message.to)
  const steps = final.status === 'delivered' ? ['sent', 'delivered'] : final.status === 'failed' ? ['failed'] : ['sent', 'undelivered']
  // The create answered "queued"; its callback comes first.
  for (const status of ['queued', ...steps]) {
    await new Promise((wait) => setTimeout(wait, stepMs))
    const last = status === final.status
    message.status = status
    message.date_updated = rfc2822()
    if (status === 'sent') message.date_sent = rfc2822()
    if (last && final.code) {
      message.error_code = final.code
      message.error_message = final.message
    }
    save(message)
    if (!message.fake.statusCallback) continue
    const params: Record<string, string> = {
      AccountSid: message.account_sid, ApiVersion: message.api_version, From: message.from, To: message.to,
      MessageSid: message.sid, SmsSid: message.sid, MessageStatus: status, SmsStatus: status,
    }
    if (last && final.code) params.ErrorCode = String(final.code)
    const answer = await postSigned(message.fake.statusCallback, params)
    message.fake.callbacks.push({ status, answer: answer.status })
    save(message)
  }
}

function publicView(message: StoredMessage): Omit<StoredMessage, 'fake'> {
  const { fake: _fake, ...resource } = message
  return resource
}

async function createMessage(req: IncomingMessage, res: ServerResponse, sid: string): Promise<void> {
  const params = formParams(await readBody(req))
  const to = params.To ?? ''
  const body = params.Body ?? ''
  const from = params.From ?? ''
  if (!to) return apiError(res, 400, 21604, "A 'To' phone number is required.")
  if (!E164.test(to)) return apiError(res, 400, 21211, `The 'To' number ${to} is not a valid phone number.`)
  if (!from && !params.MessagingServiceSid) return apiError(res, 400, 21603, "A 'From' or 'MessagingServiceSid' parameter is required to send a message.")
  if (!body) return apiError(res, 400, 21602, 'Message body is required.')
  if (body.length > 1600) return apiError(res, 400, 21617, 'The concatenated message body exceeds the 1600 character limit.')
  const messageSid = newSid('SM')
  const now = rfc2822()
  const message: StoredMessage = {
    sid: messageSid, account_sid: sid, api_version: '2010-04-01', direction: 'outbound-api', from: from || params.MessagingServiceSid!, to, body,
    status: 'queued', error_code: null, error_message: null, num_segments: String(Math.max(1, Math.ceil(body.length / 153))), num_media: '0',
    messaging_service_sid: params.MessagingServiceSid ?? null, price: null, price_unit: 'USD', date_created: now, date_updated: now, date_sent: null,
    uri: `${API}/Accounts/${sid}/Messages/${messageSid}.json`, subresource_uris: { media: `${API}/Accounts/${sid}/Messages/${messageSid}/Media.json` },
    fake: { statusCallback: params.StatusCallback || null, callbacks: [] },
  }
  messages.set(messageSid, message)
  save(message)
  send(res, 201, publicView(message))
  void walkStatuses(message)
}

/** A patient's reply, delivered to the app's inbound webhook as the real service delivers it. */
async function injectInbound(req: IncomingMessage, res: ServerResponse): Promise<void> {
  const text = await readBody(req)
  const input = (req.headers['content-type'] ?? '').includes('json') ? JSON.parse(text || '{}') as Record<string, string> : formParams(text)
  const { from, to, body, url } = input
  if (!from || !E164.test(from)) return send(res, 400, { error: 'from must be an E.164 number' })
  if (typeof body !== 'string' || body === '') return send(res, 400, { error: 'body is required' })
  if (!url || !URL.canParse(url)) return send(res, 400, { error: 'url (the app\'s inbound webhook) is required' })
  const messageSid = newSid('SM')
  const now = rfc2822()
  const recipient = to || process.env.NUXT_SMS_FROM || '+12095550100'
  const message: StoredMessage = {
    sid: messageSid, account_sid: accountSid, api_version: '2010-04-01', direction: 'inbound', from, to: recipient, body, status: 'received',
    error_code: null, error_message: null, num_segments: '1', num_media: '0', messaging_service_sid: null, price: null, price_unit: 'USD',
    date_created: now, date_updated: now, date_sent: now, uri: `${API}/Accounts/${accountSid}/Messages/${messageSid}.json`,
    subresource_uris: { media: `${API}/Accounts/${accountSid}/Messages/${messageSid}/Media.json` },
    fake: { statusCallback: null, callbacks: [], inboundUrl: url },
  }
  const params: Record<string, string> = {
    ToCountry: 'US', ToState: '', SmsMessageSid: messageSid, NumMedia: '0', ToCity: '', FromZip: '', SmsSid: messageSid, FromState: '',
    SmsStatus: 'received', FromCity: '', Body: body, FromCountry: 'US', To: recipient, ToZip: '', NumSegments: '1', MessageSid: messageSid,
    AccountSid: accountSid, From: from, ApiVersion: '2010-04-01',
  }
  const answer = await postSigned(url, params)
  message.fake.inboundAnswer = answer.status
  messages.set(messageSid, message)
  save(message)
  send(res, 200, { sid: messageSid, webhookStatus: answer.status, webhookBody: answer.text })
}

const MESSAGES_PATH = /^\/2010-04-01\/Accounts\/([A-Za-z0-9]{1,64})\/Messages\.json$/
const MESSAGE_PATH = /^\/2010-04-01\/Accounts\/([A-Za-z0-9]{1,64})\/Messages\/([A-Za-z0-9]{1,64})\.json$/

async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
  const url = new URL(req.url ?? '/', `http://${host}:${port}`)
  if (url.pathname === '/_fake/inbound' && req.method === 'POST') return injectInbound(req, res)
  if (url.pathname === '/_fake/messages' && req.method === 'GET') {
    const to = url.searchParams.get('to')
    const from = url.searchParams.get('from')
    const list = [...messages.values()].filter((message) => (!to || message.to === to) && (!from || message.from === from))
    return send(res, 200, list)
  }
  const many = MESSAGES_PATH.exec(url.pathname)
  const one = MESSAGE_PATH.exec(url.pathname)
  const sid = many?.[1] ?? one?.[1]
  if (!sid) return apiError(res, 404, 20404, 'The requested resource was not found')
  if (!authorised(req, sid)) return apiError(res, 401, 20003, 'Authenticate')
  if (many && req.method === 'POST') return createMessage(req, res, sid)
  if (one && req.method === 'GET') {
    const message = messages.get(one[2]!)
    if (!message || message.account_sid !== sid) return apiError(res, 404, 20404, `The requested resource ${url.pathname} was not found`)
    return send(res, 200, publicView(message))
  }
  return apiError(res, 405, 20004, 'Method not allowed')
}

const server = createServer((req, res) => {
  handle(req, res).catch((error: unknown) => {
    if (!res.headersSent) apiError(res, 400, 20001, error instanceof Error ? error.message : 'Bad request')
  })
})
server.on('error', (error) => console.error('sms fake:', error.message))
server.listen(port, host, () => console.log(`sms fake on ${host}:${port} -> ${smsDir}`))

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => server.close(() => process.exit(0)))
}
