import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';

import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { GasesApi } from '../gases-api';
import { GAS_MODEL_WORDS, Gas, GasModel } from '../gases.models';

/** The gases runs can name, with how the engine finds each one's heat capacity. */
@Component({
  selector: 'qw-gas-list',
  imports: [ProblemBanner, DecimalPipe, MatProgressBarModule, MatTableModule],
  templateUrl: './gas-list.html',
  styleUrl: './gas-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'page' },
})
export class GasList {
  protected readonly columns = ['code', 'name', 'molarMass', 'model'];
  protected readonly gases = signal<Gas[] | null>(null);
  protected readonly problem = signal<ProblemDetails | null>(null);

  constructor() {
    inject(GasesApi)
      .list()
      .pipe(takeUntilDestroyed())
      .subscribe({
        next: (list) => this.gases.set(list.items),
        error: (error: unknown) => this.problem.set(toProblem(error)),
      });
  }

  protected modelInWords(model: GasModel): string {
    return GAS_MODEL_WORDS[model] ?? model;
  }

  /** kg/mol as g/mol, the figure chemists know by heart. */
  protected gramsPerMole(gas: Gas): number {
    return gas.molarMass * 1000;
  }
}
