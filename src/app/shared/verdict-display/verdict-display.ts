import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

import { VERDICT_LABELS, type Verdict } from '@contract';

/** The engine's verdict on a run's energy balance (the contract's); null until a balance has been computed. */
export type { Verdict };

interface VerdictLook {
  icon: string;
  word: string;
  /** Longer wording for assistive technology and the tooltip-free title. */
  meaning: string;
}

export const VERDICT_LOOKS: Readonly<Record<Verdict | 'none', VerdictLook>> = {
  closes: {
    icon: 'check_circle',
    word: VERDICT_LABELS.closes,
    meaning: 'Balance closes within its uncertainty',
  },
  breaks: {
    icon: 'cancel',
    word: VERDICT_LABELS.breaks,
    meaning: 'Balance breaks: the residual exceeds its uncertainty',
  },
  indeterminate: {
    icon: 'help',
    word: VERDICT_LABELS.indeterminate,
    meaning: 'Indeterminate: the uncertainty is too wide for the check to mean anything',
  },
  none: { icon: 'pending', word: 'Not checked', meaning: 'No balance computed yet' },
};

/** A verdict as icon and word together; colour only repeats what both already say. */
@Component({
  selector: 'qw-verdict-display',
  imports: [MatIconModule],
  templateUrl: './verdict-display.html',
  styleUrl: './verdict-display.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    '[class]': '"verdict verdict-" + key()',
    '[attr.title]': 'look().meaning',
  },
})
export class VerdictDisplay {
  readonly verdict = input<Verdict | null>(null);

  protected readonly key = computed(() => this.verdict() ?? 'none');
  protected readonly look = computed(() => VERDICT_LOOKS[this.key()]);
}
