// Waitlist entries and recall due dates for the demo patients (issue 17), computed from today so the
// Waitlist and Recall screens are full whenever the demo is seeded.
import { addDays, todayIn } from '../shared/utils/local-date'
import type { SeedContext } from './context'

const PLANS = [
  [{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MO' }],
  [{ templateCode: 'CLEAN-ADULT' }],
  [{ templateCode: 'EXAM-NEW' }],
  [{ templateCode: 'COMP-ANT', tooth: '8', surfaces: 'M' }],
]

export async function seedWaitlistAndRecall(ctx: SeedContext): Promise<void> {
  const { faker } = ctx
  const today = todayIn('UTC')
  const patients = (await ctx.db('patients').orderBy('id').select('id', 'preferred_site_id')) as Array<{ id: number; preferred_site_id: number | null }>
  // Waitlist: the last 12 patients, a few per site.
  const waiting = patients.slice(-12)
  await ctx.db('waitlist_entries').insert(waiting.map((patient, index) => ({
    patient_id: patient.id, site_id: patient.preferred_site_id!, site_ids: JSON.stringify([patient.preferred_site_id]),
    items: JSON.stringify(PLANS[index % PLANS.length]), from_date: today, to_date: addDays(today, 21 + (index % 3) * 14),
    part_of_day: faker.helpers.arrayElement(['any', 'any', 'morning', 'afternoon']), notice_minutes: faker.helpers.arrayElement([0, 60, 120, 240, 1440]),
    priority: 1 + (index % 5), note: index % 4 === 0 ? 'Happy to come at short notice' : '',
    created_at: new Date(Date.now() - (12 - index) * 86_400_000),
  })))
  // Recall: two patients in five are due for a cleaning, one in four for an exam, from 90 days overdue to 90 days ahead.
  const recalls = patients.flatMap((patient, index) => [
    ...(index % 5 < 2 ? [{ patient_id: patient.id, kind: 'cleaning', due_date: addDays(today, faker.number.int({ min: -90, max: 90 })) }] : []),
    ...(index % 4 === 0 ? [{ patient_id: patient.id, kind: 'exam', due_date: addDays(today, faker.number.int({ min: -90, max: 90 })) }] : []),
  ])
  await ctx.db.batchInsert('recalls', recalls, 100)
}
