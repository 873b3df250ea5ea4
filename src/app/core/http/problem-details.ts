import { HttpErrorResponse } from '@angular/common/http';

/** One field the server refused, from a 400 problem. */
export interface FieldProblem {
  /** Name of the body field, as sent. */
  field: string;
  /** What is wrong with it, written for a person. */
  message: string;
}

/** RFC 9457 problem details, as the Qwell API answers every error. */
export interface ProblemDetails {
  /** URI naming the kind of problem; `about:blank` when there is no more to say. */
  type: string;
  /** Short summary of the kind of problem. */
  title: string;
  /** HTTP status; 0 when the server could not be reached. */
  status: number;
  /** What happened and what to do about it: the text to show. */
  detail: string;
  /** Per-field messages on validation problems. */
  errors?: FieldProblem[];
}

/** Said when the server sent no detail of its own. */
const FALLBACK_DETAIL: Readonly<Record<number, string>> = {
  0: "Qwell's server can't be reached. Check your connection and try again.",
  400: 'Some of what was sent is missing or not valid. Check the fields and try again.',
  401: 'Your session has ended. Sign in again to go on.',
  403: "Your role doesn't allow this.",
  404: "This record doesn't exist, or it was removed.",
  409: 'Someone else changed this record in the meantime. Reload it and make your change again.',
  423: 'This account is locked for now. Try again later.',
  429: 'Too many attempts in a short time. Wait a minute, then try again.',
};

const SERVER_FAULT =
  'Something went wrong on the server. Try again; if it keeps happening, tell your administrator.';

/** Turns whatever an HttpClient call failed with into a problem a page can show. */
export function toProblem(error: unknown): ProblemDetails {
  const status = error instanceof HttpErrorResponse ? error.status : 0;
  const body: unknown = error instanceof HttpErrorResponse ? error.error : undefined;
  const sent = isRecord(body) ? body : {};
  const fallback = FALLBACK_DETAIL[status] ?? SERVER_FAULT;
  const errors = Array.isArray(sent['errors']) ? sent['errors'].filter(isFieldProblem) : undefined;
  return {
    type: typeof sent['type'] === 'string' ? sent['type'] : 'about:blank',
    title: typeof sent['title'] === 'string' ? sent['title'] : fallback,
    status,
    detail: typeof sent['detail'] === 'string' && sent['detail'].trim() ? sent['detail'] : fallback,
    ...(errors?.length ? { errors } : {}),
  };
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function isFieldProblem(value: unknown): value is FieldProblem {
  return isRecord(value) && typeof value['field'] === 'string' && typeof value['message'] === 'string';
}
