import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** Where an instrument stands against its calibration due date. */
export type CalibrationStatus = 'valid' | 'due-soon' | 'expired' | 'none';

export const CALIBRATION_LOOKS: Readonly<Record<CalibrationStatus, { icon: string; word: string }>> = {
  valid: { icon: 'verified', word: 'In calibration' },
  'due-soon': { icon: 'schedule', word: 'Due soon' },
  expired: { icon: 'event_busy', word: 'Expired' },
  none: { icon: 'remove_circle_outline', word: 'No calibration' },
};

/** Calibration status as a chip with icon and word; colour repeats what both already say. */
@Component({
  selector: 'qw-calibration-status-chip',
  imports: [MatIconModule],
  templateUrl: './calibration-status-chip.html',
  styleUrl: './calibration-status-chip.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '[class]': '"chip chip-" + key()' },
})
export class CalibrationStatusChip {
  readonly status = input<CalibrationStatus | null>(null);

  protected readonly key = computed(() => this.status() ?? 'none');
  protected readonly look = computed(() => CALIBRATION_LOOKS[this.key()]);
}
