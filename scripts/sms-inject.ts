// A patient's reply through the local SMS fake: the fake signs it as the real service does and
// delivers it to the app's inbound webhook.
//   npm run sms:inject -- --from +12095550142 --body C [--url http://127.0.0.1:3000/api/sms/inbound]
import { parseArgs } from 'node:util'

const { values } = parseArgs({ options: { from: { type: 'string' }, body: { type: 'string' }, to: { type: 'string' }, url: { type: 'string' } } })
const fake = process.env.NUXT_SMS_FAKE_URL || `http://${process.env.SMS_FAKE_HOST ?? '127.0.0.1'}:${process.env.SMS_FAKE_PORT ?? 4010}`
const url = values.url ?? `${(process.env.NUXT_MAIL_PUBLIC_URL ?? 'http://127.0.0.1:3000').replace(/\/+$/, '')}/api/sms/inbound`
if (!values.from || values.body === undefined) {
  console.log('usage: npm run sms:inject -- --from +1XXXXXXXXXX --body TEXT [--to +1…] [--url app inbound webhook]')
  process.exit(2)
}
const response = await fetch(`${fake}/_fake/inbound`, {
  method: 'POST', headers: { 'Content-Type': 'application/json' },
  body: JSON.stringify({ from: values.from, body: values.body, to: values.to, url }),
})
console.log(response.status, await response.text())
process.exit(response.ok ? 0 : 1)
