// What the numbered demo seeds hand on to each other.
import type { Knex } from 'knex'
import { Faker, en } from '@faker-js/faker'

export const DEMO_PASSWORD = 'cuspline-demo'
export const DEMO_DOMAIN = 'fernhollow.test' // .test is reserved (RFC 2606): these addresses never reach anyone.

export interface SeedContext {
  db: Knex.Transaction
  faker: Faker
  /** site slug → id */
  sites: Record<string, number>
  /** operatory ids per site slug, in board order */
  operatories: Record<string, number[]>
  /** provider key (e.g. 'dentist.main') → provider id */
  providers: Record<string, number>
}

/** A fixed seed: the same demo every time. */
export function demoFaker(): Faker {
  const faker = new Faker({ locale: [en] })
  faker.seed(20261201)
  return faker
}
