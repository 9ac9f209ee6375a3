// Every error a user can cause is answered here with a status and a message a person can act on.
import type { H3Event } from 'h3'
import type { ZodError, ZodType } from 'zod'
import { DomainValidationError } from '#shared/domain/errors'
import { MAX_ID } from '#shared/domain/input-bounds'
import type { FieldProblem } from '#shared/types/api-errors'

export const MESSAGES = {
  signedOut: 'Please sign in.',
  forbidden: 'Your role does not allow this.',
  forbiddenSite: 'This site is outside your sites.',
  badCredentials: 'E-mail or password is incorrect.',
  tooManyAttempts: 'Too many failed sign-in attempts. Try again later.',
  foreignOrigin: 'This request came from another web site and was refused.',
  jsonOnly: 'Send the request body as JSON (Content-Type: application/json).',
  notFound: 'Not found.',
} as const

export function badRequest(field: string, reason: string, issues: FieldProblem[] = [{ field, reason }]) {
  return createError({
    statusCode: 400,
    statusMessage: 'Bad Request',
    message: `${field}: ${reason}`,
    data: { field, reason, issues },
  })
}

export function notFound(what = 'Not found.') {
  return createError({ statusCode: 404, statusMessage: 'Not Found', message: what })
}

export function conflict(message: string, data: Record<string, unknown> = {}) {
  return createError({ statusCode: 409, statusMessage: 'Conflict', message, data })
}

function zodProblems(error: ZodError): FieldProblem[] {
  return error.issues.map((issue) => ({
    field: issue.path.length ? issue.path.join('.') : '(body)',
    reason: issue.message,
  }))
}

/**
 * What h3's readValidatedBody/getValidatedQuery put in the 400's `data`: its own enumerable
 * fields are serialised, so the client reads `data.field`, `data.reason` and `data.issues`.
 */
class ValidationProblem extends Error {
  readonly field: string
  readonly reason: string
  readonly issues: FieldProblem[]
  constructor(issues: FieldProblem[]) {
    const first = issues[0] ?? { field: '(body)', reason: 'is invalid' }
    super(`${first.field}: ${first.reason}`)
    this.field = first.field
    this.reason = first.reason
    this.issues = issues
  }
}

/** Turns a zod schema into an h3 validator whose failures are 400s naming the field and the reason. */
export function validateWith<T>(schema: ZodType<T>) {
  return (input: unknown): T => {
    const parsed = schema.safeParse(input ?? {})
    if (parsed.success) return parsed.data
    throw new ValidationProblem(zodProblems(parsed.error))
  }
}

/** Domain rules (a bad tooth, a surface that does not fit it) reach the client as 400s too. */
export function rethrowDomainError(error: unknown): never {
  if (error instanceof DomainValidationError) throw badRequest(error.field, error.reason)
  throw error
}

/** Route params are validated like bodies. */
export function numericParam(event: H3Event, name: string): number {
  const raw = getRouterParam(event, name)
  const value = Number(raw)
  if (!raw || !/^\d+$/.test(raw) || !Number.isInteger(value) || value <= 0 || value > MAX_ID) {
    throw badRequest(name, `must be a whole number from 1 to ${MAX_ID}`)
  }
  return value
}

/** MariaDB's duplicate-key error (a unique index refused the row). */
export function isDuplicateKey(error: unknown): boolean {
  return typeof error === 'object' && error !== null && (error as { code?: unknown }).code === 'ER_DUP_ENTRY'
}

/** For values assembled on the server (a PATCH merged into the stored record): a 400 like a body's. */
export function assertValid<T>(schema: ZodType<T>, value: unknown): T {
  const parsed = schema.safeParse(value)
  if (parsed.success) return parsed.data
  const issues = zodProblems(parsed.error)
  throw badRequest(issues[0]!.field, issues[0]!.reason, issues)
}
