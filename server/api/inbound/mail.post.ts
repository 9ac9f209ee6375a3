// POST /api/inbound/mail: the inbound-mail service posts one raw message (message/rfc822), signed
// with the shared secret (server/utils/inbound-signature.ts). No session: the signature is the
// credential, checked before anything is read from the message; unsigned, forged or replayed posts
// are 401 and change nothing. Calendar replies act on their visit (services/inbound-service.ts).
import { INBOUND_HEADERS } from '../../utils/inbound-signature'
import { receiveInboundMail } from '../../services/inbound-service'

export default defineEventHandler(async (event): Promise<{ outcome: string; note: string }> => {
  const body = (await readRawBody(event, false)) ?? Buffer.alloc(0)
  return receiveInboundMail({
    id: getRequestHeader(event, INBOUND_HEADERS.id),
    timestamp: getRequestHeader(event, INBOUND_HEADERS.timestamp),
    signature: getRequestHeader(event, INBOUND_HEADERS.signature),
    recipient: getRequestHeader(event, INBOUND_HEADERS.recipient),
    body: Buffer.isBuffer(body) ? body : Buffer.from(body),
  })
})
