import { LiveAnnouncer } from '@angular/cdk/a11y';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output, signal, untracked } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { unitSymbol } from '@contract';
import { catchError, of } from 'rxjs';

import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { ColumnChoice, choicesFrom, mappingFrom, withChannel, withReference, withUnit } from '../import-mapping';
import { ImportsApi } from '../imports-api';
import {
  CHANNEL_LABELS,
  ColumnMap,
  IMPORT_CHANNELS,
  ImportChannel,
  ImportMapping,
  ImportPreview,
  ImportSummary,
  PressureReference,
  RowError,
  UNITS_BY_CHANNEL,
} from '../imports.models';
import { Confirmation } from '../../../shared/confirmation/confirmation';

/** Step 2: what each column holds and in which unit; the first rows, the summary and every row error. */
@Component({
  selector: 'qw-import-mapping-step',
  imports: [ProblemBanner, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule],
  templateUrl: './import-mapping-step.html',
  styleUrl: './import-mapping-step.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportMappingStep {
  private readonly api = inject(ImportsApi);
  private readonly announcer = inject(LiveAnnouncer);
  private readonly confirmation = inject(Confirmation);

  readonly preview = input.required<ImportPreview>();
  /** The mapping as chosen so far (null while something is missing). */
  readonly mappingChange = output<ImportMapping | null>();

  protected readonly channels = IMPORT_CHANNELS;
  protected readonly channelLabels = CHANNEL_LABELS;
  protected readonly unitsByChannel = UNITS_BY_CHANNEL;
  protected readonly choices = signal<ColumnChoice[]>([]);
  protected readonly result = computed(() => mappingFrom(this.choices()));
  /** Errors and summary of the last server check (the preview's own at first). */
  protected readonly checked = signal<{ errors: RowError[]; errorCount: number; summary: ImportSummary } | null>(null);
  protected readonly checking = signal(false);
  protected readonly problem = signal<ProblemDetails | null>(null);
  protected readonly mapName = signal('');
  protected readonly savedMaps = signal<ColumnMap[]>([]);
  private readonly loadedMaps = toSignal(this.api.columnMaps().pipe(catchError(() => of([] as ColumnMap[]))));

  constructor() {
    effect(() => {
      const p = this.preview();
      untracked(() => {
        this.choices.set(choicesFrom(p.columns, p.suggestedColumnMap?.mapping));
        // The preview's errors belong to Qwell's guessed mapping; with a saved map applied, or no guess, they say nothing yet.
        this.checked.set(p.suggestedColumnMap || !p.mapping ? null : { errors: p.errors, errorCount: p.errorCount, summary: p.summary });
      });
    });
    effect(() => this.savedMaps.set(this.loadedMaps() ?? []));
    effect(() => {
      const mapping = this.result().mapping;
      untracked(() => this.mappingChange.emit(mapping));
    });
  }

  protected perChannel(summary: ImportSummary): Array<{ channel: ImportChannel; min: number; max: number; unit: string }> {
    return Object.entries(summary.perChannel).map(([channel, v]) => ({ channel: channel as ImportChannel, ...v! }));
  }

  protected unitLabel(unit: string): string {
    return unitSymbol(unit);
  }

  protected setChannel(index: number, channel: ImportChannel | null): void {
    this.choices.update((c) => withChannel(c, index, channel));
    this.checked.set(null);
  }

  protected setUnit(index: number, unit: string): void {
    this.choices.update((c) => withUnit(c, index, unit));
    this.checked.set(null);
  }

  protected setReference(index: number, reference: PressureReference): void {
    this.choices.update((c) => withReference(c, index, reference));
  }

  protected applyMap(map: ColumnMap): void {
    this.choices.set(choicesFrom(this.preview().columns, map.mapping));
    this.checked.set(null);
    this.announcer.announce(`Column map "${map.name}" applied.`);
  }

  /** Has the server check every row against the chosen mapping (nothing is stored). */
  checkRows(): void {
    const mapping = this.result().mapping;
    if (!mapping) return;
    this.checking.set(true);
    this.problem.set(null);
    this.api.check(this.preview().importId, mapping).subscribe({
      next: (check) => {
        this.checking.set(false);
        this.checked.set(check);
        this.announcer.announce(check.errorCount ? `${check.errorCount} row problem(s) found.` : 'Every row is readable with this mapping.');
      },
      error: (error: unknown) => {
        this.checking.set(false);
        this.problem.set(toProblem(error));
      },
    });
  }

  protected saveMap(): void {
    const mapping = this.result().mapping;
    const name = this.mapName().trim();
    if (!mapping || name.length < 2) return;
    this.api.saveColumnMap(name, this.preview().columns.map((c) => c.header), mapping).subscribe({
      next: (saved) => {
        this.savedMaps.update((maps) => [...maps, saved]);
        this.mapName.set('');
        this.confirmation.show(`Column map "${saved.name}" saved for the next file from this logger.`);
      },
      error: (error: unknown) => this.problem.set(toProblem(error)),
    });
  }
}
