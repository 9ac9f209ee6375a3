// One error type for bad domain input. The server turns it into 400 { field, reason },
// so `field` is a path the client can point at (for example `items.1.surfaces`).
export class DomainValidationError extends Error {
  readonly field: string
  readonly reason: string

  constructor(field: string, reason: string) {
    super(reason)
    this.name = 'DomainValidationError'
    this.field = field
    this.reason = reason
  }
}
