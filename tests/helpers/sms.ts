// Reading what really arrived at the local SMS fake over HTTP (scripts/sms-fake.ts, started by
// scripts/test.sh), and fictional numbers to send to.
export interface FakeMessage { sid: string; to: string; from: string; body: string; status: string; direction: string }

const FAKE = () => process.env.NUXT_SMS_FAKE_URL!

/** The texts the fake has taken for this number (E.164), oldest first. */
export async function fakeMessages(to: string): Promise<FakeMessage[]> {
  const response = await fetch(`${FAKE()}/_fake/messages?to=${encodeURIComponent(to)}`)
  return (await response.json()) as FakeMessage[]
}

/** A fictional number (555-01xx) with an area code the demo's patients do not use; line 98/99 only when asked. */
export function freshNumber(line?: string): { written: string; e164: string } {
  const area = String(600 + Math.floor(Math.random() * 300))
  const last = line ?? String(Math.floor(Math.random() * 98)).padStart(2, '0')
  return { written: `(${area}) 555-01${last}`, e164: `+1${area}55501${last}` }
}

/** A patient's reply, delivered by the fake to the app's inbound webhook signed as the real service signs (as scripts/sms-inject.ts). */
export async function injectReply(appUrl: string, from: string, body: string): Promise<{ sid: string; webhookStatus: number }> {
  const response = await fetch(`${FAKE()}/_fake/inbound`, {
    method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ from, body, url: `${appUrl.replace(/\/+$/, '')}/api/sms/inbound` }),
  })
  if (response.status !== 200) throw new Error(`the SMS fake refused the reply: ${response.status} ${await response.text()}`)
  return (await response.json()) as { sid: string; webhookStatus: number }
}
