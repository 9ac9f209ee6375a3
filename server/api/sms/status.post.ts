// POST /api/sms/status: the SMS service's delivery report on a text (form-encoded, X-Twilio-Signature).
// Unsigned or wrongly signed: 403 and nothing changes. No session: the signature is the credential.
import { readSignedWebhook } from '../../utils/sms-webhook'
import { recordDeliveryStatus } from '../../services/sms/webhook-service'

export default defineEventHandler(async (event) => {
  const params = await readSignedWebhook(event)
  await recordDeliveryStatus(params)
  setResponseStatus(event, 204)
  return null
})
