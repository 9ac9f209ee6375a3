// A test site that sends patient e-mail: contact details, the demo's mail settings, patients with
// unique addresses and consent. `mailLane` keeps its messages away from the main test server.
import { randomUUID } from 'node:crypto'
import { createAnnex, type Annex } from './booking-fixtures'
import { testDb } from './db'

export interface MailAnnex extends Annex {
  emails: string[]
  siteEmail: string
  address: string
  phone: string
}

export async function createMailAnnex(options: { patients?: number; providers?: number; mailLane?: string; settings?: Record<string, unknown> } = {}): Promise<MailAnnex> {
  const annex = await createAnnex({ rooms: 2, providers: options.providers ?? 1, patients: options.patients ?? 3, timeZone: 'America/Los_Angeles' })
  const tag = randomUUID().slice(0, 8)
  const siteEmail = `annex-${tag}@fernhollow.test`
  const address = `${100 + Math.floor(Math.random() * 800)} Larkspur Lane, Fernhollow, CA 95000`
  const phone = '555-0142'
  await testDb()('sites').where({ id: annex.siteId }).update({
    email: siteEmail, address, phone,
    settings: JSON.stringify({
      minimumNoticeMinutes: 0, reminderOffsetsHours: [48, 3], quietHours: { start: '20:00', end: '08:00' }, includeProcedureNames: false,
      ...(options.mailLane ? { mailLane: options.mailLane } : {}), ...options.settings,
    }),
  })
  const emails: string[] = []
  for (const [index, id] of annex.patientIds.entries()) {
    const email = `mail-${tag}-${index}@fernhollow.test`
    await testDb()('patients').where({ id }).update({ email, email_consent: true })
    emails.push(email)
  }
  return { ...annex, emails, siteEmail, address, phone }
}

export function bookingFor(annex: Annex, patientIndex: number, startUtc: string, items: unknown = [{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MO' }]) {
  return { siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[patientIndex], startUtc, items }
}

export async function outboxRowsOf(visitId: number) {
  return testDb()('outbox').where({ visit_id: visitId }).orderBy('id')
}
