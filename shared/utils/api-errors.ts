// Reading a failed $fetch: ofetch puts the API's error answer (ApiErrorBody) in `data`.
import type { ApiErrorBody, FieldProblem } from '../types/api-errors'

export function apiErrorBody(caught: unknown): ApiErrorBody | undefined {
  return (caught as { data?: ApiErrorBody } | null | undefined)?.data
}

/** The answer's message, or `fallback` when there is none (network failure, no body). */
export function apiErrorMessage(caught: unknown, fallback: string): string {
  return apiErrorBody(caught)?.message ?? fallback
}

/** The fields a 400 named; empty for any other failure. */
export function apiErrorIssues(caught: unknown): FieldProblem[] {
  return apiErrorBody(caught)?.data?.issues ?? []
}

export function apiErrorStatus(caught: unknown): number | undefined {
  return (caught as { statusCode?: number } | null | undefined)?.statusCode
}
