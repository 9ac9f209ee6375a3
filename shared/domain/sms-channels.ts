// Which channels (e-mail, text) each patient message kind goes out on, per site
// (`sites.settings.messageChannels`). Default: e-mail for everything, and a text as well for reminders.
// A text is only ever sent to a patient who agreed to texts and has not replied STOP.
import type { QuietHours } from './reminders'
import { isQuiet } from './reminders'
import { addDays, localDateAt, localTime, localToUtcMs, minutesOfDay } from '../utils/local-date'

export const CHANNELS = ['email', 'sms'] as const
export type Channel = (typeof CHANNELS)[number]
export const CHANNEL_KINDS = ['invitation', 'update', 'cancellation', 'reminder'] as const
export type ChannelKind = (typeof CHANNEL_KINDS)[number]
export type MessageChannels = Record<ChannelKind, Channel[]>

export const DEFAULT_MESSAGE_CHANNELS: MessageChannels = {
  invitation: ['email'], update: ['email'], cancellation: ['email'], reminder: ['email', 'sms'],
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
