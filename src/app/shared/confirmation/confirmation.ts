import { Injectable, inject } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';

/** How long a confirmation stays: long enough to read a sentence, and it waits while hovered or focused. */
export const CONFIRMATION_MS = 6000;

/**
 * A visible confirmation that something was saved (a column map, a signature, a role, a calibration).
 * Material's snack bar also announces it to screen readers, politely, so no second announcement is made.
 */
@Injectable({ providedIn: 'root' })
export class Confirmation {
  private readonly snackBar = inject(MatSnackBar);

  show(message: string): void {
    this.snackBar.open(message, 'OK', { duration: CONFIRMATION_MS, politeness: 'polite' });
  }
}
