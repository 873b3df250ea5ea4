import type { RequestHandler } from 'express';
import { badRequest, type FieldError } from './problem';

/** Deepest nesting a request body may have; the deepest real body (a run document's setup) is 5. */
export const MAX_JSON_DEPTH = 32;

/** Keys that would reach an object's prototype when a library copies the body into a class or a merge. */
const PROTOTYPE_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

/**
 * Control characters no field of Qwell holds: C0 except tab, line feed and carriage return (notes and
 * reasons keep their line breaks), DEL, and the C1 block. NUL also cannot be stored by PostgreSQL.
 */
// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;

const describeChar = (s: string): string => {
  const c = CONTROL.exec(s)![0].charCodeAt(0);
  return c === 0 ? 'a NUL character (U+0000)' : `the control character U+${c.toString(16).toUpperCase().padStart(4, '0')}`;
};

/** A field's name in messages: `a.b[3].c`. */
export const joinField = (path: string, key: string | number) => (typeof key === 'number' ? `${path}[${key}]` : path ? `${path}.${key}` : key);

/** The problem of a string value at `field`, if it holds a control character. */
export function stringProblem(s: string, field: string): FieldError | null {
  return CONTROL.test(s) ? { field, message: `${field} contains ${describeChar(s)}; remove it and send again` } : null;
}

/** The problem of a field name `key` (at `at`): a prototype key or a control character. */
export function keyProblem(key: string, at: string): FieldError | null {
  if (PROTOTYPE_KEYS.has(key)) return { field: at, message: `"${key}" is not a field name Qwell accepts` };
  if (CONTROL.test(key)) return { field: at, message: `a field name contains ${describeChar(key)}` };
  return null;
}

/** The problem of an object or array that starts deeper than MAX_JSON_DEPTH (at `field`). */
export const depthProblem = (field: string): FieldError => ({ field, message: `the body is nested more than ${MAX_JSON_DEPTH} levels deep at ${field}; no Qwell request is` });

/**
 * The problems of a parsed JSON value, walked without recursion (a body nested 10 000 deep must not
 * overflow the stack here, and never reaches class-transformer): too deep, a prototype key, a
 * control character in a string or a key. At most `max` problems are listed.
 */
export function inputProblems(value: unknown, max = 20): FieldError[] {
  const problems: FieldError[] = [];
  const stack: Array<{ v: unknown; path: string; depth: number }> = [{ v: value, path: '', depth: 0 }];
  while (stack.length > 0 && problems.length < max) {
    const { v, path, depth } = stack.pop()!;
    const field = path || '(body)';
    if (typeof v === 'string') {
      const problem = stringProblem(v, field);
      if (problem) problems.push(problem);
      continue;
    }
    if (v === null || typeof v !== 'object') continue;
    if (depth >= MAX_JSON_DEPTH) {
      problems.push(depthProblem(field));
      continue;
    }
    if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) {
        const item: unknown = v[i];
        // Numbers are most of a large body (readings): skip them without a stack entry.
        if (item !== null && (typeof item === 'object' || typeof item === 'string')) stack.push({ v: item, path: joinField(path, i), depth: depth + 1 });
      }
      continue;
    }
    for (const key of Object.keys(v)) {
      const at = joinField(path, key);
      const problem = keyProblem(key, at);
      if (problem) {
        problems.push(problem);
        continue;
      }
      stack.push({ v: (v as Record<string, unknown>)[key], path: at, depth: depth + 1 });
    }
  }
  return problems;
}

/** The 400 for a value with the problems above. */
export const refusedInput = (problems: FieldError[], where = 'request') =>
  badRequest(`The ${where} was refused: ${problems.slice(0, 3).map((p) => p.message).join('; ')}. Nothing was changed.`, problems);

/** Throws a 400 naming the fields, when a value (a body, the query) has any of the problems above. */
export function assertCleanInput(value: unknown, where = 'request'): void {
  const problems = inputProblems(value);
  if (problems.length > 0) throw refusedInput(problems, where);
}

/**
 * Input hygiene for every API route, after the JSON parser and before any router: the body, the query
 * string and the route's path are checked; API answers are never stored by caches.
 */
export const inputHygiene: RequestHandler = (req, res, next) => {
  res.setHeader('Cache-Control', 'no-store');
  try {
    if (CONTROL.test(decodeURIComponentSafe(req.path))) throw badRequest('The address contains a control character; nothing was changed.');
    assertCleanInput(req.query, 'query string');
    if (req.body !== undefined) assertCleanInput(req.body, 'request body');
    next();
  } catch (err) {
    next(err);
  }
};

function decodeURIComponentSafe(s: string): string {
  try {
    return decodeURIComponent(s);
  } catch {
    return s;
  }
}
