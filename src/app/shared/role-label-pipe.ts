import { Pipe, PipeTransform } from '@angular/core';

import { ROLE_LABELS, Role } from '../core/auth/auth.models';

/** `'quality' | roleLabel` → "Quality officer". */
@Pipe({ name: 'roleLabel' })
export class RoleLabelPipe implements PipeTransform {
  transform(role: Role | null | undefined): string {
    return role ? ROLE_LABELS[role] : '';
  }
}
