// Request bodies on the API are at most MAX_BODY_BYTES (256 KiB). Checked first, before the origin
// check, the session and any parsing: a declared Content-Length above the limit is refused at once,
// and a chunked body (no length declared) is counted while it arrives and refused the moment it
// passes the limit. An accepted chunked body is handed to h3 as already read, so it is read once.
import type { IncomingMessage } from 'node:http'

const MAX_BODY_BYTES = 256 * 1024
const TOO_LARGE = 'The request body is too large: at most 256 KiB is accepted.'
/**
 * The CSV import's upload carries a file of up to 10 MB as JSON text; escaping (\" and \n) can
 * double it, so the body may be 21 MiB. The service refuses a file over 10 MB itself, also with 413.
 */
const LARGER_LIMITS: Record<string, number> = { '/api/patient-imports': 21 * 1024 * 1024 }
const RAW_BODY = Symbol.for('h3RawBody')
const PAYLOAD_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])

function tooLarge(limit = MAX_BODY_BYTES) {
  return createError({ statusCode: 413, statusMessage: 'Payload Too Large', message: limit === MAX_BODY_BYTES ? TOO_LARGE : 'The file is too large: at most 10 MB is accepted.' })
}

/** Reads a body of unknown length, counting bytes; rejects with 413 as soon as it passes the limit. */
function readCounted(request: IncomingMessage, limit: number): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    let received = 0
    const onData = (chunk: Buffer) => {
      received += chunk.length
      if (received > limit) {
        request.off('data', onData)
        request.resume() // let the rest drain; the connection is closed after the answer
        reject(tooLarge(limit))
        return
      }
      chunks.push(chunk)
    }
    request.on('data', onData)
    request.on('end', () => resolve(Buffer.concat(chunks)))
    request.on('error', reject)
  })
}

export default defineEventHandler(async (event) => {
  if (!event.path.startsWith('/api/')) return
  const request = event.node.req
  const limit = (event.method === 'POST' && LARGER_LIMITS[event.path.split('?')[0]!]) || MAX_BODY_BYTES
  const declared = request.headers['content-length']
  if (declared !== undefined) {
    const length = Number(declared)
    if (!Number.isFinite(length) || length > limit) {
      setResponseHeader(event, 'connection', 'close')
      throw tooLarge(limit)
    }
    return
  }
  if (!PAYLOAD_METHODS.has(event.method) || !/\bchunked\b/i.test(String(request.headers['transfer-encoding'] ?? ''))) return
  try {
    const body = await readCounted(request, limit)
    ;(request as unknown as Record<symbol, unknown>)[RAW_BODY] = Promise.resolve(body)
  } catch (error) {
    setResponseHeader(event, 'connection', 'close')
    throw error
  }
})
