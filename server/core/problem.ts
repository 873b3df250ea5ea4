/** One field-level problem in a request, for forms to show beside the field. */
export interface FieldError {
  field: string;
  message: string;
}

/**
 * An error that becomes an RFC 9457 problem answer. Services throw these; the one error handler
 * (server/core/error-handler.ts) turns them into `application/problem+json`.
 */
export class HttpProblem extends Error {
  constructor(
    readonly status: number,
    readonly title: string,
    readonly detail: string,
    readonly errors?: FieldError[],
    readonly extra: Record<string, unknown> = {},
  ) {
    super(detail);
    this.name = 'HttpProblem';
  }
}

export const badRequest = (detail: string, errors?: FieldError[]) => new HttpProblem(400, 'Bad request', detail, errors);
export const unauthorized = (detail = 'Sign in to continue.') => new HttpProblem(401, 'Not signed in', detail);
export const forbidden = (detail: string) => new HttpProblem(403, 'Not allowed', detail);
export const notFound = (detail: string) => new HttpProblem(404, 'Not found', detail);
export const conflict = (detail: string, extra: Record<string, unknown> = {}) =>
  new HttpProblem(409, 'Conflict', detail, undefined, extra);
