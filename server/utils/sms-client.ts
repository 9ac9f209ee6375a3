// The hosted SMS service's SDK client (twilio), built once per process from runtimeConfig.sms.
// NUXT_SMS_FAKE_URL set: the SDK's own requests are sent to that address instead of the service's
// (a RequestClient subclass, the SDK's supported `httpClient` option, which keeps the path, query,
// Basic auth and form body exactly as the SDK made them). Empty: the same code talks to the real service.
import twilio from 'twilio'
import type BaseRequestClient from 'twilio/lib/base/RequestClient'

export type SmsClient = ReturnType<typeof twilio>

export interface SmsConfig {
  accountSid: string
  authToken: string
  from: string
  fakeUrl: string
  webhookBaseUrl: string
  defaultCountry: string
}

/** Sends every SDK request to `baseUrl` (the local fake), keeping path and query. */
class RedirectingRequestClient extends twilio.RequestClient {
  constructor(private readonly baseUrl: string) {
    super({ timeout: 15_000 })
  }

  override request<TData>(opts: BaseRequestClient.RequestOptions<TData>) {
    const target = new URL(opts.uri)
    return super.request<TData>({ ...opts, uri: `${this.baseUrl.replace(/\/+$/, '')}${target.pathname}${target.search}` })
  }
}

export function smsConfig(): SmsConfig {
  const sms = useRuntimeConfig().sms
  return {
    accountSid: String(sms.accountSid ?? ''), authToken: String(sms.authToken ?? ''), from: String(sms.from ?? ''),
    fakeUrl: String(sms.fakeUrl ?? ''), webhookBaseUrl: String(sms.webhookBaseUrl || useRuntimeConfig().mail.publicUrl),
    defaultCountry: String(sms.defaultCountry || 'US'),
  }
}

let client: SmsClient | null | undefined

/** The SDK client, or null when no account is set up (texts are then skipped with a reason). */
export function useSmsClient(): SmsClient | null {
  if (client !== undefined) return client
  const config = smsConfig()
  if (!config.accountSid) return (client = null)
  client = twilio(config.accountSid, config.authToken, {
    ...(config.fakeUrl ? { httpClient: new RedirectingRequestClient(config.fakeUrl) } : { timeout: 15_000 }),
  })
  return client
}

/** The full URL the service signed: our public address plus the path and query it called. */
export function webhookUrlOf(path: string): string {
  return `${smsConfig().webhookBaseUrl.replace(/\/+$/, '')}${path}`
}

/** The SDK's own check of X-Twilio-Signature (HMAC over URL + sorted POST params with the auth token). */
export function isSignedByService(signature: string | undefined, path: string, params: Record<string, string>): boolean {
  const { authToken } = smsConfig()
  if (!authToken || !signature) return false
  return twilio.validateRequest(authToken, signature, webhookUrlOf(path), params)
}
