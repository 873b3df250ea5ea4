import { AbstractControl } from '@angular/forms';

import { ProblemDetails } from '../../core/http/problem-details';

/**
 * Puts the server's per-field messages of a 400 beside the fields they name, as a `server` error
 * on the matching control (`spec.resolution` finds the nested control). `fieldNames` maps a body
 * field to a control path where the two differ (e.g. `ratedPressure` → `ratedPressureValue`).
 * Returns the messages no control took, so the page can still show them.
 */
export function showServerFieldErrors(
  form: AbstractControl,
  problem: ProblemDetails,
  fieldNames: Readonly<Record<string, string>> = {},
): string[] {
  const leftOver: string[] = [];
  for (const { field, message } of problem.errors ?? []) {
    const control = form.get(fieldNames[field] ?? field);
    if (control) {
      control.setErrors({ ...(control.errors ?? {}), server: message });
      control.markAsTouched();
    } else {
      leftOver.push(message);
    }
  }
  return leftOver;
}
