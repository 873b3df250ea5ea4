import type { ClassConstructor } from 'class-transformer';
import { plainToInstance } from 'class-transformer';
import { validate } from 'class-validator';
import { badRequest } from './problem';

/** Validates a query string against a DTO; repeated parameters (?a=1&a=2) are refused. */
export async function validateQuery<T extends object>(dto: ClassConstructor<T>, query: unknown): Promise<T> {
  const raw: Record<string, unknown> = {};
  for (const [key, value] of Object.entries((query ?? {}) as Record<string, unknown>)) {
    if (typeof value !== 'string') throw badRequest(`Query parameter "${key}" must be given once, as plain text.`);
    // An empty filter from a form (?state=) means "any", as if it were left out.
    if (value !== '') raw[key] = value;
  }
  const instance = plainToInstance(dto, raw);
  const errors = await validate(instance, { whitelist: true, forbidNonWhitelisted: true });
  if (errors.length > 0) {
    const list = errors.flatMap((e) => Object.values(e.constraints ?? {}).map((message) => ({ field: e.property, message })));
    throw badRequest(list.map((e) => e.message).join('; '), list);
  }
  return instance;
}
