// The JSON body of an API error, as server/utils/errors.ts builds it (h3's error answer).

/** One field a 400 names, and why. */
export interface FieldProblem {
  field: string
  reason: string
}

export interface ApiErrorBody {
  statusCode?: number
  statusMessage?: string
  /** A sentence a person can act on (a 400 reads "field: reason"). */
  message?: string
  /** 400: the first field and every issue; 409: the field and what clashed. */
  data?: { field?: string; reason?: string; issues?: FieldProblem[]; [key: string]: unknown }
}
