// POST /api/sms/inbound: a patient's text reply from the SMS service (form-encoded, X-Twilio-Signature).
// Unsigned or wrongly signed: 403 and nothing changes. The answer text goes out through the outbox,
// so this returns an empty TwiML response.
import { readSignedWebhook } from '../../utils/sms-webhook'
import { receiveReply } from '../../services/sms/webhook-service'

export default defineEventHandler(async (event) => {
  const params = await readSignedWebhook(event)
  await receiveReply(params)
  setResponseHeader(event, 'Content-Type', 'text/xml; charset=utf-8')
  return '<?xml version="1.0" encoding="UTF-8"?><Response></Response>'
})
