// The checks every booking, move and re-plan passes inside its transaction, after the locks.
import type { VisitPlan } from '#shared/types/chair-time'
import type { BookingConflict, PatientDto } from '#shared/types/visits'
import type { EpochInterval } from '#shared/types/rota'
import type { StoredTemplate } from '#shared/types/templates'
import type { DisplayStyle } from '#shared/types/display'
import { formatDateTime, formatTime } from '#shared/utils/display-time'
import { localMinutesAt, localTime } from '#shared/utils/local-date'
import { expandAvailabilityMs } from '#shared/domain/rota'
import type { Db } from '../utils/db'
import { badRequest, conflict } from '../utils/errors'
import { scheduleNowMs } from '../utils/clock'
import type { SiteCalendarInputs } from '../repositories/site-calendar'
import { findBookingParties, type BookingParties } from '../repositories/booking-parties'
import type { TextPatient } from '../repositories/sms'
import { clashStatement, type NewSegment, type SegmentClash } from '../repositories/visits'
import { allOf, inOneTrip, type Statement } from '../repositories/round-trip'

const nothingSent = allOf([]) as Statement<unknown>

const MINUTE = 60_000
const DAY = 86_400_000

export interface BookingRequest {
  calendar: SiteCalendarInputs
  plan: VisitPlan
  templates: StoredTemplate[]
  operatoryId: number
  providerId: number
  patientId: number
  startMs: number
  /** The visit being moved, so it does not collide with itself. */
  exceptVisitId: number | null
  /** The provider and patient when the caller read them already (a booking's first round trip). */
  parties?: BookingParties
}

export function visitEnd(plan: VisitPlan, startMs: number): number {
  return startMs + plan.chairMinutes * MINUTE
}

/** The plan's segments placed at the start time in one chair with one provider. */
export function placeSegments(plan: VisitPlan, startMs: number, operatoryId: number, providerId: number): NewSegment[] {
  return plan.segments.map((segment) => ({
    kind: segment.kind, label: segment.label, operatoryId, providerId,
    startMs: startMs + segment.startMinute * MINUTE, endMs: startMs + segment.endMinute * MINUTE,
  }))
}

/** A span as refusals name it, on the site's clock and in its date order: 'Mon, Dec 7, 9:30 AM to 10:15 AM'. */
function spanText(startMs: number, endMs: number, style: DisplayStyle, joiner: string): string {
  return `${formatDateTime(startMs, style)}${joiner}${formatTime(endMs, style)}`
}

/** On the site's booking grid in local time, and not sooner than the minimum notice. */
export function assertStartAllowed(startMs: number, calendar: SiteCalendarInputs, nowMs = scheduleNowMs()): void {
  const zone = calendar.site.timeZone
  if (localMinutesAt(startMs, zone) % calendar.bookingUnitMinutes !== 0 || startMs % 60_000 !== 0) {
    throw badRequest('startUtc', `must be on the site's ${calendar.bookingUnitMinutes}-minute grid (local time ${localTime(new Date(startMs).toISOString(), zone)}${startMs % 60_000 === 0 ? '' : ' and some seconds'})`)
  }
  if (startMs < nowMs + calendar.minimumNoticeMinutes * MINUTE) {
    throw badRequest('startUtc', `must be at least ${calendar.minimumNoticeMinutes} minutes from now`)
  }
}

function covered(intervals: readonly EpochInterval[], startMs: number, endMs: number): boolean {
  return intervals.some((interval) => interval.startMs <= startMs && interval.endMs >= endMs)
}

function clashError(resource: BookingConflict['resource'], id: number, name: string, clash: SegmentClash, style: DisplayStyle, what: string) {
  const startMs = new Date(clash.startUtc).getTime()
  const endMs = new Date(clash.endUtc).getTime()
  const detail: BookingConflict = {
    resource, id, name, startUtc: new Date(startMs).toISOString(), endUtc: new Date(endMs).toISOString(), visitId: clash.visitId,
  }
  return conflict(`${name} ${what} from ${spanText(startMs, endMs, style, ' to ')}.`, { conflict: detail })
}

function unavailableError(resource: BookingConflict['resource'], id: number, name: string, startMs: number, endMs: number, message: string) {
  const detail: BookingConflict = { resource, id, name, startUtc: new Date(startMs).toISOString(), endUtc: new Date(endMs).toISOString(), visitId: null }
  return conflict(message, { conflict: detail })
}

async function assertPeopleAndRoom(db: Db, request: BookingRequest) {
  const room = request.calendar.operatoryDetails.find((operatory) => operatory.id === request.operatoryId)
  if (!room) throw badRequest('operatoryId', 'is not a room of this site')
  if (!room.active) throw badRequest('operatoryId', `${room.name} is not in use`)
  const missing = request.templates.find((template) => !room.capabilities.includes(template.capability))
  if (missing) throw badRequest('operatoryId', `${room.name} is not equipped for ${missing.capability} (${missing.name})`)
  const { provider, patient, textPatient, openWaitlistEntryIds } = request.parties ?? await findBookingParties(db, request.providerId, request.patientId)
  if (!provider || !provider.active) throw badRequest('providerId', 'is not an active provider')
  const unskilled = request.templates.find((template) => !provider.capabilities.includes(template.category))
  if (unskilled) throw badRequest('providerId', `${provider.name} does not do ${unskilled.category} procedures (${unskilled.name})`)
  if (!patient) throw badRequest('patientId', 'no such patient (or the record was merged into another)')
  return { room, provider, patient, textPatient, openWaitlistEntryIds }
}

/**
 * Throws 400/409 unless the visit fits: room and provider exist and fit, time is open and free.
 * Also the patient as the outbox's channel choice reads them (`textReachFrom`), and their open
 * waitlist entries, from the same row. `sendAlong` (a new visit's insert) goes to MariaDB in the same
 * round trip as the clash check, after it: when a clash is found this throws, and the caller's
 * transaction rolls the insert back with everything else.
 */
export async function assertBookable<T = undefined>(db: Db, request: BookingRequest, sendAlong?: Statement<T>): Promise<{ patient: PatientDto; textPatient?: TextPatient; openWaitlistEntryIds: number[]; along: T }> {
  const { room, provider, patient, textPatient, openWaitlistEntryIds } = await assertPeopleAndRoom(db, request)
  const { plan, startMs, calendar } = request
  const endMs = visitEnd(plan, startMs)
  const style = calendar.display
  const handsOn = placeSegments(plan, startMs, request.operatoryId, request.providerId).filter((segment) => segment.kind === 'hands_on')

  // Only this room's and this provider's rows: the rest of the site cannot change the answer.
  const availability = expandAvailabilityMs({
    site: calendar.site,
    operatories: calendar.operatories.filter((operatory) => operatory.id === room.id),
    shifts: calendar.shifts.filter((shift) => shift.providerId === provider.id),
    exceptions: calendar.exceptions.filter((exception) => exception.providerId === provider.id),
    blocks: calendar.blocks.filter((block) => block.operatoryId === null || block.operatoryId === room.id || block.providerId === provider.id),
    fromUtc: new Date(startMs - DAY).toISOString(), toUtc: new Date(endMs + DAY).toISOString(),
  })
  const roomTime = availability.operatories.find((entry) => entry.operatoryId === room.id)?.intervals ?? []
  if (!covered(roomTime, startMs, endMs)) {
    throw unavailableError('operatory', room.id, room.name, startMs, endMs, `${room.name} is closed or blocked during ${spanText(startMs, endMs, style, '–')}.`)
  }
  const providerTime = availability.providers.find((entry) => entry.providerId === provider.id)?.intervals ?? []
  const offShift = handsOn.find((segment) => !covered(providerTime, segment.startMs, segment.endMs))
  if (offShift) {
    throw unavailableError('provider', provider.id, provider.name, offShift.startMs, offShift.endMs, `${provider.name} is not on shift here (or is blocked) at ${formatDateTime(offShift.startMs, style)}.`)
  }

  const clash = clashStatement(db, {
    operatoryId: room.id, startMs, endMs, providerId: provider.id, handsOn, patientId: request.patientId, exceptVisitId: request.exceptVisitId,
  })
  const [clashes, along] = await inOneTrip(db, [clash, sendAlong ?? nothingSent as Statement<T>])
  if (clashes.operatory) throw clashError('operatory', room.id, room.name, clashes.operatory, style, 'is already taken')
  if (clashes.provider) throw clashError('provider', provider.id, provider.name, clashes.provider, style, 'is already working with another patient')
  if (clashes.patient) throw clashError('patient', request.patientId, 'This patient', clashes.patient, style, 'already has a visit')
  return { patient, textPatient, openWaitlistEntryIds, along }
}
