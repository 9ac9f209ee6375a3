// The channels a patient message goes out on: the site's choice per kind (messageChannels in
// sites.settings, shared/domain/sms-channels.ts), narrowed to what the patient can take (e-mail with
// consent; a text with consent, a number that reads as E.164 and no STOP). Called inside the
// booking and cancel transactions; the dispatcher checks again at send time.
import type { Db } from '../../utils/db'
import type { NewOutboxMessage } from '../../repositories/outbox'
import { findTextPatient, type TextPatient } from '../../repositories/sms'
import { channelsFor, channelsWithReason, reachOn, type Channel, type ChannelKind } from '#shared/domain/sms-channels'
import { toE164 } from '#shared/domain/sms-phone'
import type { CountryCode } from 'libphonenumber-js'
import { smsConfig } from '../../utils/sms-client'

export interface TextReach { email: boolean; sms: boolean }

export async function textReachOf(db: Db, patientId: number): Promise<TextReach> {
  return textReachFrom(await findTextPatient(db, patientId))
}

/** The reach of a patient row already read (a booking reads it with the provider, findBookingParties). */
export function textReachFrom(patient: TextPatient | undefined): TextReach {
  if (!patient) return { email: false, sms: false }
  const country = smsConfig().defaultCountry as CountryCode
  // A guardian's contact counts too: whether a minor's message goes to it is decided at send time
  // (the dispatcher, on the visit's date), and a minor with no guardian contact is skipped there, in words.
  return {
    email: Boolean((patient.email || patient.guardianEmail) && patient.emailConsent),
    sms: patient.smsConsent && !patient.smsOptedOutAt && (toE164(patient.phone, country) !== null || toE164(patient.guardianPhone, country) !== null),
  }
}

/**
 * Each message once per channel the site uses for its kind and the patient can take. `known` is the
 * patient's reach when the caller read their row in the same transaction already (saves a round trip).
 */
export async function onChannels(db: Db, patientId: number | undefined, siteSettings: Record<string, unknown>, messages: NewOutboxMessage[], known?: TextReach): Promise<NewOutboxMessage[]> {
  if (patientId === undefined || !messages.length) return []
  const reach = known ?? await textReachOf(db, patientId)
  return messages.flatMap((message) => channelsFor(message.kind as ChannelKind, siteSettings, reach).map((channel) => ({ ...message, channel })))
}

/**
 * The channels an offer (a waitlist offer, a move offer) goes by: the site's choice for its kind,
 * narrowed to what reaches the patient, or for a minor on `onDate` their guardian (`reachOn`). With
 * none, `why` says in words what stops each channel, for the front desk.
 */
export async function offerChannels(db: Db, kind: Extract<ChannelKind, 'offer' | 'move_offer'>, patientId: number, siteSettings: Record<string, unknown>, onDate: string): Promise<{ channels: Channel[]; why: string | null }> {
  const patient = await findTextPatient(db, patientId)
  if (!patient) return { channels: [], why: 'the patient no longer exists' }
  return channelsWithReason(kind, siteSettings, reachOn(patient, onDate, smsConfig().defaultCountry as CountryCode))
}
