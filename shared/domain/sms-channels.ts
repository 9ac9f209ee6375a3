// Which channels (e-mail, text) each patient message kind goes out on, per site
// (`sites.settings.messageChannels`). Default: e-mail for everything, and a text as well for reminders
// and for offers (a waitlist offer, a move offer: issue 17, first to answer wins, so both at once).
// A text is only ever sent to a patient who agreed to texts and has not replied STOP.
import type { CountryCode } from 'libphonenumber-js'
import type { QuietHours } from './reminders'
import { isQuiet } from './reminders'
import { recipientOf, type RecipientPatient } from './message-recipient'
import { toE164 } from './sms-phone'
import { addDays, localDateAt, localTime, localToUtcMs, minutesOfDay } from '../utils/local-date'

export const CHANNELS = ['email', 'sms'] as const
export type Channel = (typeof CHANNELS)[number]
export const CHANNEL_KINDS = ['invitation', 'update', 'cancellation', 'reminder', 'offer', 'move_offer'] as const
export type ChannelKind = (typeof CHANNEL_KINDS)[number]
export type MessageChannels = Record<ChannelKind, Channel[]>

export const DEFAULT_MESSAGE_CHANNELS: MessageChannels = {
  invitation: ['email'], update: ['email'], cancellation: ['email'], reminder: ['email', 'sms'], offer: ['email', 'sms'], move_offer: ['email', 'sms'],
}

export function messageChannelsOf(settings: Record<string, unknown>): MessageChannels {
  const stored = settings.messageChannels as Partial<Record<string, unknown>> | undefined
  const result = { ...DEFAULT_MESSAGE_CHANNELS }
  if (!stored || typeof stored !== 'object') return result
  for (const kind of CHANNEL_KINDS) {
    const value = stored[kind]
    if (Array.isArray(value)) result[kind] = CHANNELS.filter((channel) => value.includes(channel))
  }
  return result
}

/** The channels a message of `kind` goes out on for this patient. */
export function channelsFor(kind: ChannelKind, settings: Record<string, unknown>, reach: { email: boolean; sms: boolean }): Channel[] {
  return messageChannelsOf(settings)[kind].filter((channel) => reach[channel])
}

export interface ReachPatient extends RecipientPatient {
  emailConsent: boolean
  smsConsent: boolean
  smsOptedOutAt: Date | string | null
}

/** Per channel: true when a message about `onDate` reaches the patient (or a minor's guardian), else why not in words. */
export type ChannelReach = Record<Channel, true | string>

/**
 * Who a message about a time on `onDate` (yyyy-MM-dd) can reach, channel by channel: the recipient
 * rule (`recipientOf`: a minor only through the guardian), the consents, STOP, and a number that reads
 * as E.164. Offers know their date when they are made, so this is decided there, not at send time.
 */
export function reachOn(patient: ReachPatient, onDate: string, country: CountryCode): ChannelReach {
  const email = recipientOf(patient, 'email', onDate)
  const sms = recipientOf(patient, 'sms', onDate)
  const whose = 'onBehalfOf' in sms && sms.onBehalfOf ? 'the guardian\'s' : 'the patient\'s'
  return {
    email: !patient.emailConsent ? 'the patient has not agreed to e-mail' : 'skip' in email ? email.skip : true,
    sms: !patient.smsConsent ? 'the patient has not agreed to texts'
      : patient.smsOptedOutAt ? 'the patient replied STOP to texts'
      : 'skip' in sms ? sms.skip
      : toE164(sms.to, country) === null ? `${whose} number cannot take texts` : true,
  }
}

/**
 * The channels a message of `kind` goes by for this reach, or (none) why not, in words: what the site
 * sends it by and what stops each of those.
 */
export function channelsWithReason(kind: ChannelKind, settings: Record<string, unknown>, reach: ChannelReach): { channels: Channel[]; why: string | null } {
  const chosen = messageChannelsOf(settings)[kind]
  const channels = channelsFor(kind, settings, { email: reach.email === true, sms: reach.sms === true })
  if (channels.length) return { channels, why: null }
  if (!chosen.length) return { channels, why: 'the site sends this message by neither e-mail nor text' }
  return { channels, why: `no e-mail or text can reach them: ${chosen.map((channel) => reach[channel]).join('; ')}` }
}

/** "e-mail and text", "text", "e-mail": how the front desk reads a message's channels. */
export function channelWords(channels: readonly Channel[]): string {
  return channels.map((channel) => (channel === 'sms' ? 'text' : 'e-mail')).join(' and ')
}

/**
 * Texts wake people, so a text that comes due inside the site's quiet hours waits until they end:
 * the instant (UTC ms) they end, or null when `nowMs` is not inside them.
 */
export function quietUntilMs(nowMs: number, quiet: QuietHours | null, timeZone: string): number | null {
  if (!quiet) return null
  const minutes = minutesOfDay(localTime(new Date(nowMs).toISOString(), timeZone))
  if (!isQuiet(minutes, quiet)) return null
  const today = localDateAt(nowMs, timeZone)
  // In the evening part the quiet hours end tomorrow morning; in the early-morning part, today.
  const endsTomorrow = minutesOfDay(quiet.start) > minutesOfDay(quiet.end) && minutes >= minutesOfDay(quiet.start)
  return localToUtcMs(endsTomorrow ? addDays(today, 1) : today, quiet.end, timeZone)
}
