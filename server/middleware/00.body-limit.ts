// Request bodies on the API are at most MAX_BODY_BYTES (256 KiB). Checked first, before the origin
// check, the session and any parsing: a declared Content-Length above the limit is refused at once,
// and a chunked body (no length declared) is counted while it arrives and refused the moment it
// passes the limit. An accepted chunked body is handed to h3 as already read, so it is read once.
import type { IncomingMessage } from 'node:http'

const MAX_BODY_BYTES = 256 * 1024
const TOO_LARGE = 'The request body is too large: at most 256 KiB is accepted.'
const RAW_BODY = Symbol.for('h3RawBody')
const PAYLOAD_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])

function tooLarge() {
  return createError({ statusCode: 413, statusMessage: 'Payload Too Large', message: TOO_LARGE })
}

/** Reads a body of unknown length, counting bytes; rejects with 413 as soon as it passes the limit. */
function readCounted(request: IncomingMessage): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    let received = 0
    const onData = (chunk: Buffer) => {
      received += chunk.length
      if (received > MAX_BODY_BYTES) {
        request.off('data', onData)
        request.resume() // let the rest drain; the connection is closed after the answer
        reject(tooLarge())
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
  const declared = request.headers['content-length']
  if (declared !== undefined) {
    const length = Number(declared)
    if (!Number.isFinite(length) || length > MAX_BODY_BYTES) {
      setResponseHeader(event, 'connection', 'close')
      throw tooLarge()
    }
    return
  }
  if (!PAYLOAD_METHODS.has(event.method) || !/\bchunked\b/i.test(String(request.headers['transfer-encoding'] ?? ''))) return
  try {
    const body = await readCounted(request)
    ;(request as unknown as Record<symbol, unknown>)[RAW_BODY] = Promise.resolve(body)
  } catch (error) {
    setResponseHeader(event, 'connection', 'close')
    throw error
  }
})
