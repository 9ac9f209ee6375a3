// About 300 generated patients. E-mails use the reserved .test domain; phone numbers use the
// 555-01xx range set aside for fiction. Texts: the SMS fake fails 555-0199 and 555-0198 (scripts/sms-fake.ts).
import { DEMO_DOMAIN, type SeedContext } from './context'

export const DEMO_PATIENT_COUNT = 300
const AREA_CODES = ['209', '307', '520']

function asciiSlug(text: string): string {
  return text.normalize('NFD').replace(/[^A-Za-z]/g, '').toLowerCase()
}

export async function seedPatients(ctx: SeedContext): Promise<void> {
  const { faker } = ctx
  const siteIds = Object.values(ctx.sites)
  const rows = Array.from({ length: DEMO_PATIENT_COUNT }, (_, index) => {
    const first = faker.person.firstName()
    const last = faker.person.lastName()
    const hasEmail = faker.number.float() < 0.92
    return {
      first_name: first,
      last_name: last,
      date_of_birth: faker.date.birthdate({ min: 2, max: 90, mode: 'age', refDate: '2026-12-01T00:00:00Z' }).toISOString().slice(0, 10),
      email: hasEmail ? `${asciiSlug(first)}.${asciiSlug(last)}.${index + 1}@${DEMO_DOMAIN}` : null,
      phone: `+1${faker.helpers.arrayElement(AREA_CODES)}55501${String(faker.number.int({ min: 0, max: 99 })).padStart(2, '0')}`, // E.164, as the app stores phones
      preferred_site_id: faker.helpers.arrayElement(siteIds),
      email_consent: hasEmail && faker.number.float() < 0.9,
      // Four in five agreed to texts (from the index, so the faker sequence and the rest of the demo stay as they were).
      sms_consent: index % 5 !== 4,
    }
  })
  await ctx.db.batchInsert('patients', rows, 100)
}
