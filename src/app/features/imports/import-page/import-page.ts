import { LiveAnnouncer } from '@angular/cdk/a11y';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { MatSelectModule } from '@angular/material/select';
import { Router } from '@angular/router';
import { HttpErrorResponse } from '@angular/common/http';
import { Observable, catchError, forkJoin, map, of } from 'rxjs';
import { RUN_PROCESSES } from '@contract';

import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { ImportMappingStep } from '../import-mapping-step/import-mapping-step';
import { ImportUpload } from '../import-upload/import-upload';
import { ApparatusApi } from '../../apparatus/apparatus-api';
import { Apparatus } from '../../apparatus/apparatus.models';
import { GasesApi } from '../../gases/gases-api';
import { Gas } from '../../gases/gases.models';
import { ProjectsApi } from '../../projects/projects-api';
import { Project } from '../../projects/projects.models';
import { RunsApi } from '../../runs/runs-api';
import { RUN_STATE_LABELS, RunPage, RunState, RunSummary } from '../../runs/runs.models';
import { ImportsApi } from '../imports-api';
import { CommitTarget, ImportMapping, ImportPreview, NewRunSetup, NewRunTarget, RowError } from '../imports.models';
import { UnitSymbolPipe } from '../../../shared/unit-symbol-pipe';

/** A logger file is imported into a run that claims a named process (a free-form path is entered by hand). */
const PROCESSES = RUN_PROCESSES.filter((process) => process !== 'free-form');
/** Barometers read hPa or mbar, gauges kPa; mmHg on older mercury columns. */
const AMBIENT_PRESSURE_UNITS = ['hPa', 'kPa', 'mbar', 'mmHg'] as const;

/** A typed number, or null when the field is empty or not a number. */
function numberOf(text: string): number | null {
  const value = Number(text.replace(',', '.'));
  return text.trim() === '' || !Number.isFinite(value) ? null : value;
}

/** Import a logger file: upload, map the columns, choose where the readings go, import all-or-nothing. */
@Component({
  selector: 'qw-import-page',
  imports: [UnitSymbolPipe, ProblemBanner, ImportMappingStep, ImportUpload, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatRadioModule, MatSelectModule],
  templateUrl: './import-page.html',
  styleUrl: './import-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'page' },
})
export class ImportPage {
  private readonly api = inject(ImportsApi);
  private readonly projectsApi = inject(ProjectsApi);
  private readonly runsApi = inject(RunsApi);
  private readonly router = inject(Router);
  private readonly announcer = inject(LiveAnnouncer);

  protected readonly processes = PROCESSES;
  protected readonly stateLabels = RUN_STATE_LABELS;
  protected readonly preview = signal<ImportPreview | null>(null);
  protected readonly mapping = signal<ImportMapping | null>(null);
  protected readonly targetKind = signal<'new' | 'existing'>('new');
  protected readonly projectId = signal<number | null>(null);
  protected readonly title = signal('');
  /** Chosen by the person: no default, since a wrong process claim changes the model work and the flags. */
  protected readonly process = signal<string>('');
  protected readonly runDate = signal(new Date().toISOString().slice(0, 10));
  protected readonly runId = signal<number | null>(null);
  // What the file does not carry: chosen here so the new draft opens with less left to do.
  protected readonly gasId = signal<number | null>(null);
  protected readonly apparatusId = signal<number | null>(null);
  protected readonly amount = signal('');
  protected readonly ambientPressure = signal('');
  protected readonly ambientPressureUnit = signal<string>('hPa');
  protected readonly ambientTemperature = signal('');
  protected readonly ambientPressureUnits = AMBIENT_PRESSURE_UNITS;
  protected readonly gases = toSignal(inject(GasesApi).list().pipe(map((body) => body.items), catchError(() => of([] as Gas[]))), { initialValue: [] });
  protected readonly apparatusList = toSignal(inject(ApparatusApi).list().pipe(map((body) => body.items), catchError(() => of([] as Apparatus[]))), {
    initialValue: [],
  });
  protected readonly importing = signal(false);
  protected readonly problem = signal<ProblemDetails | null>(null);
  protected readonly rowErrors = signal<RowError[]>([]);

  protected readonly projects = toSignal(
    this.projectsApi.list().pipe(
      map((body) => body.items),
      catchError(() => of([] as Project[])),
    ),
    { initialValue: [] },
  );
  /** One's own runs whose readings may be replaced: drafts and returned runs. */
  protected readonly drafts = toSignal(
    forkJoin([this.myRuns('draft'), this.myRuns('returned')]).pipe(
      map(([drafts, returned]) => [...drafts.items, ...returned.items]),
      catchError(() => of([] as RunSummary[])),
    ),
    { initialValue: [] },
  );

  /** Why the Import button is not ready yet, or null when it is. */
  protected readonly notReady = computed(() => {
    if (!this.mapping()) return 'Finish the column mapping first.';
    if (this.targetKind() === 'existing') return this.runId() ? null : 'Choose the draft whose readings the file replaces.';
    if (!this.projectId()) return 'Choose the project of the new draft.';
    if (this.title().trim().length < 3) return 'Give the new draft a title of at least 3 characters.';
    if (!this.process()) return 'Choose the process the run claims (isobaric, isothermal, …).';
    if (!/^\d{4}-\d{2}-\d{2}$/.test(this.runDate())) return 'Give the run date.';
    if (this.amount().trim() !== '' && !(numberOf(this.amount())! > 0)) return 'The amount of gas is a number of moles above 0, or left empty.';
    if (this.ambientPressure().trim() !== '' && !(numberOf(this.ambientPressure())! > 0)) return 'The ambient pressure is a number above 0, or left empty.';
    if (this.ambientTemperature().trim() !== '' && numberOf(this.ambientTemperature()) === null) return 'The ambient temperature is a number (°C), or left empty.';
    return null;
  });

  protected previewArrived(preview: ImportPreview): void {
    this.preview.set(preview);
    this.problem.set(null);
    this.rowErrors.set([]);
    if (!this.title()) this.title.set(preview.filename.replace(/\.[^.]+$/, ''));
    this.announcer.announce(`${preview.filename} read: ${preview.summary.rows} rows, ${preview.errorCount} row problem(s).`);
  }

  /** Imports all rows; on success opens the run's entry page. */
  importFile(): void {
    const preview = this.preview();
    const mapping = this.mapping();
    if (!preview || !mapping || this.notReady()) return;
    this.importing.set(true);
    this.problem.set(null);
    this.rowErrors.set([]);
    if (this.targetKind() === 'existing') {
      const runId = this.runId()!;
      // Replacing the readings quotes the run's current version.
      this.runsApi.get(runId).subscribe({
        next: (run) => this.commit(preview, mapping, { runId, version: run.version }),
        error: (error: unknown) => this.fail(error),
      });
    } else {
      this.commit(preview, mapping, this.newRunTarget());
    }
  }

  /** The new draft with what was chosen beside the file; fields left empty are left out. */
  newRunTarget(): NewRunTarget {
    const gas = this.gases().find((g) => g.id === this.gasId());
    const amount = numberOf(this.amount());
    const pressure = numberOf(this.ambientPressure());
    const temperature = numberOf(this.ambientTemperature());
    const setup: NewRunSetup = {
      ...(gas ? { gas: { model: 'species' as const, species: gas.code } } : {}),
      ...(amount !== null ? { amount: { from: 'moles' as const, value: amount } } : {}),
      ...(pressure !== null || temperature !== null
        ? {
            ambient: {
              ...(pressure !== null ? { pressure: { value: pressure, unit: this.ambientPressureUnit() } } : {}),
              ...(temperature !== null ? { temperature: { value: temperature, unit: 'degC' } } : {}),
            },
          }
        : {}),
    };
    return {
      newRun: {
        projectId: this.projectId()!,
        title: this.title().trim(),
        process: this.process(),
        runDate: this.runDate(),
        ...(gas ? { gasId: gas.id } : {}),
        ...(this.apparatusId() !== null ? { apparatusId: this.apparatusId()! } : {}),
        ...(Object.keys(setup).length ? { setup } : {}),
      },
    };
  }

  private myRuns(state: RunState): Observable<RunPage> {
    return this.runsApi.list({ state, mine: true, pageSize: 100 });
  }

  private commit(preview: ImportPreview, mapping: ImportMapping, target: CommitTarget): void {
    this.api.commit(preview.importId, mapping, target).subscribe({
      next: (result) => {
        this.importing.set(false);
        this.announcer.announce(`Imported ${result.readings} readings from ${preview.filename}. The run is open for editing.`);
        void this.router.navigate(['/runs', result.runId, 'edit']);
      },
      error: (error: unknown) => this.fail(error),
    });
  }

  private fail(error: unknown): void {
    this.importing.set(false);
    this.problem.set(toProblem(error));
    const body = error instanceof HttpErrorResponse ? (error.error as { rowErrors?: RowError[] } | null) : null;
    this.rowErrors.set(Array.isArray(body?.rowErrors) ? body.rowErrors : []);
  }
}
