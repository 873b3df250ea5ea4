import { plainToInstance, type ClassConstructor } from 'class-transformer';
import { validate, type ValidationError } from 'class-validator';
import { badRequest, type FieldError } from './problem';

function flatten(errors: ValidationError[], prefix = ''): FieldError[] {
  return errors.flatMap((error) => {
    const field = prefix ? `${prefix}.${error.property}` : error.property;
    const own = Object.values(error.constraints ?? {}).map((message) => ({ field, message }));
    return [...own, ...flatten(error.children ?? [], field)];
  });
}

/** Validates a request body against a class-validator DTO; unknown fields are refused, not ignored. */
export async function validateBody<T extends object>(dto: ClassConstructor<T>, body: unknown): Promise<T> {
  if (body === null || typeof body !== 'object' || Array.isArray(body)) {
    throw badRequest('The request body must be a JSON object.');
  }
  const instance = plainToInstance(dto, body);
  const errors = await validate(instance, { whitelist: true, forbidNonWhitelisted: true });
  if (errors.length > 0) {
    const fieldErrors = flatten(errors);
    throw badRequest(fieldErrors.map((e) => e.message).join('; '), fieldErrors);
  }
  return instance;
}
