import { LiveAnnouncer } from '@angular/cdk/a11y';
import { DatePipe, Location } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, OnInit, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatRadioModule } from '@angular/material/radio';
import { MatSelectModule } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import { CHANNEL_LABELS } from '@contract';
import { firstValueFrom, forkJoin, map, merge } from 'rxjs';

import { HeadingFocus } from '../../../core/layout/heading-focus';
import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { ApparatusApi } from '../../apparatus/apparatus-api';
import { Apparatus } from '../../apparatus/apparatus.models';
import { GasesApi } from '../../gases/gases-api';
import { Gas } from '../../gases/gases.models';
import { InstrumentsApi } from '../../instruments/instruments-api';
import { Instrument } from '../../instruments/instruments.models';
import { ProjectsApi } from '../../projects/projects-api';
import { Project } from '../../projects/projects.models';
import { RunsApi } from '../runs-api';
import { RUN_STATE_LABELS } from '../runs.models';
import { READING_CHANNELS, ReadingChannel, RUN_PROCESSES, RunSetup } from '../run-entry.models';
import { RunRecord } from '../run-detail.models';
import { RunChecklist } from '../run-checklist/run-checklist';
import { InstrumentPicker } from './instrument-picker/instrument-picker';
import { GridColumn, ReadingsGrid } from './readings-grid/readings-grid';
import { ReadingsSheet } from './readings-grid/readings-sheet';
import { AutosaveSource, RunAutosave } from './run-autosave';
import { RULE_MESSAGES, createBody, createRunForm, enabledChannels, loadDraft, readingsBody, updateBody } from './run-entry-form';
import { SafetyNotices } from './safety-notices/safety-notices';
import { problemSentence } from './submit-problems';
import { CHANNEL_KINDS, toSi, unitLabel, unitsOf } from './unit-table';
import { UnitPicker } from './unit-picker/unit-picker';
import { UnitSymbolPipe } from '../../../shared/unit-symbol-pipe';

/** Instrument kind of the register that reads each channel. */
const INSTRUMENT_KINDS: Readonly<Record<ReadingChannel, string>> = {
  pressure: 'pressure',
  volume: 'volume',
  displacement: 'displacement',
  temperature: 'temperature',
  voltage: 'voltage',
  current: 'current',
  power: 'power',
};

function today(): string {
  const now = new Date();
  return `${now.getFullYear()}-${String(now.getMonth() + 1).padStart(2, '0')}-${String(now.getDate()).padStart(2, '0')}`;
}

/** Run entry at the bench: a new run (/runs/new) or a draft being edited (/runs/:id/edit). */
@Component({
  selector: 'qw-run-entry',
  imports: [
    UnitSymbolPipe,
    RunChecklist,
    ProblemBanner,
    DatePipe,
    InstrumentPicker,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatRadioModule,
    MatSelectModule,
    ReactiveFormsModule,
    ReadingsGrid,
    RouterLink,
    SafetyNotices,
    UnitPicker,
  ],
  providers: [RunAutosave],
  templateUrl: './run-entry.html',
  styleUrl: './run-entry.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'page' },
})
export class RunEntry implements OnInit {
  private readonly api = inject(RunsApi);
  private readonly projectsApi = inject(ProjectsApi);
  private readonly gasesApi = inject(GasesApi);
  private readonly apparatusApi = inject(ApparatusApi);
  private readonly instrumentsApi = inject(InstrumentsApi);
  private readonly router = inject(Router);
  private readonly announcer = inject(LiveAnnouncer);
  private readonly headingFocus = inject(HeadingFocus);
  private readonly destroyRef = inject(DestroyRef);
  private readonly location = inject(Location);
  protected readonly autosave = inject(RunAutosave);

  /** Run id from /runs/:id/edit; absent for a new run. */
  readonly id = input<string>();

  protected readonly form = createRunForm(today());
  protected readonly sheet = signal(new ReadingsSheet(3));
  protected readonly processes = RUN_PROCESSES;
  protected readonly channelNames = READING_CHANNELS;
  protected readonly channelLabels = CHANNEL_LABELS;
  protected readonly instrumentKinds = INSTRUMENT_KINDS;
  protected readonly ruleMessages = RULE_MESSAGES;
  protected readonly massUnits = unitsOf('mass');

  protected readonly projects = signal<Project[]>([]);
  protected readonly gases = signal<Gas[]>([]);
  protected readonly apparatus = signal<Apparatus[]>([]);
  protected readonly instruments = signal<Instrument[]>([]);
  protected readonly loading = signal(true);
  protected readonly loadProblem = signal<ProblemDetails | null>(null);
  protected readonly locked = signal<RunRecord | null>(null);
  /** The reviewer's reason on a returned run, shown above the form. */
  protected readonly returnReason = signal<string | null>(null);
  protected readonly stateLabels = RUN_STATE_LABELS;
  protected readonly submitProblem = signal<ProblemDetails | null>(null);
  protected readonly submitting = signal(false);
  /** Set by the first submit: from then on every unmet rule shows, touched or not. */
  protected readonly triedSubmit = signal(false);
  /** The setup as last loaded: keys the form does not own pass through from here. */
  private readonly setupBase = signal<RunSetup>({});
  /** Change subscriptions are made once, on the first begin(); a reload only restarts autosave. */
  private subscribed = false;

  protected readonly value = toSignal(this.form.valueChanges.pipe(map(() => this.form.getRawValue())), {
    initialValue: this.form.getRawValue(),
  });
  protected readonly formErrors = toSignal(this.form.statusChanges.pipe(map(() => this.form.errors)), {
    initialValue: this.form.errors,
  });

  protected readonly gridColumns = computed<GridColumn[]>(() => {
    const v = this.value();
    const time: GridColumn = { key: 'time', label: 'Time', kind: 'time', unit: this.form.controls.timeUnit, unitText: v.timeUnit };
    return [
      time,
      ...enabledChannels(v).map((name) => ({
        key: name,
        label: CHANNEL_LABELS[name],
        kind: CHANNEL_KINDS[name],
        unit: this.form.controls.channels.controls[name].controls.unit,
        unitText: unitLabel(v.channels[name].unit),
      })),
    ];
  });
  protected readonly chosenApparatus = computed(() => this.apparatus().find((a) => a.id === this.value().apparatusId) ?? null);
  protected readonly heating = computed(() => {
    const c = this.value().channels;
    return c.voltage.enabled || c.current.enabled || c.power.enabled;
  });
  protected readonly highestPressurePa = computed(() => {
    const sheet = this.sheet();
    sheet.revision();
    const max = sheet.maxOf('pressure');
    return max === null ? null : toSi('pressure', this.value().channels.pressure.unit, max);
  });
  protected readonly ambientPressurePa = computed(() => {
    const v = this.value();
    return v.ambientPressure === null ? null : toSi('pressure', v.ambientPressureUnit, v.ambientPressure);
  });
  protected readonly title = computed(() => {
    const code = this.autosave.code();
    return this.id() || code ? `Edit run ${code ?? ''}`.trim() : 'New run';
  });

  constructor() {
    // Every change of the grid's text is a readings change; a fresh sheet (revision 0) is not.
    effect(() => {
      const revision = this.sheet().revision();
      if (revision > 0) {
        untracked(() => this.autosave.changed('readings'));
      }
    });
    // Once the first save has created the run, the address names it, so a reload opens this draft.
    effect(() => {
      const id = this.autosave.runId();
      if (id !== null && !this.id()) {
        untracked(() => this.location.replaceState(`/runs/${id}/edit`));
      }
    });
  }

  ngOnInit(): void {
    forkJoin({
      projects: this.projectsApi.list(),
      gases: this.gasesApi.list(),
      apparatus: this.apparatusApi.list(),
      instruments: this.instrumentsApi.list(),
    }).subscribe({
      next: (lists) => {
        this.projects.set(lists.projects.items);
        this.gases.set(lists.gases.items);
        this.apparatus.set(lists.apparatus.items);
        this.instruments.set(lists.instruments.items);
        if (lists.projects.items.length === 1) {
          this.form.controls.projectId.setValue(lists.projects.items[0].id);
        }
        const id = Number(this.id());
        if (this.id() && Number.isInteger(id)) {
          void this.loadRun(id);
        } else {
          this.begin(null);
        }
      },
      error: (error: unknown) => this.fail(error),
    });
  }

  /** Reloads the run from the server after a conflict, dropping what was not saved. */
  protected async reloadRun(): Promise<void> {
    const id = this.autosave.runId();
    if (id !== null) {
      await this.loadRun(id);
      void this.announcer.announce('The run was reloaded with the latest saved changes.', 'polite');
    }
  }

  protected async submitRun(): Promise<void> {
    this.form.markAllAsTouched();
    this.triedSubmit.set(true);
    this.submitProblem.set(null);
    this.submitting.set(true);
    try {
      if (!(await this.autosave.saveNow())) {
        const state = this.autosave.state();
        const detail = state.kind === 'failed' ? state.reason : state.kind === 'conflict' ? state.detail : 'The run could not be saved.';
        this.submitProblem.set({ type: 'about:blank', title: 'Not saved', status: 0, detail: `The run could not be saved first: ${detail}` });
        return;
      }
      const id = this.autosave.runId()!;
      await firstValueFrom(this.api.submitDraft(id, this.autosave.currentVersion));
      void this.announcer.announce(`Run ${this.autosave.code() ?? ''} submitted; its balance check is running.`, 'polite');
      await this.router.navigate(['/runs', id]);
    } catch (error: unknown) {
      const problem = toProblem(error);
      if (problem.status === 409) {
        this.autosave.conflict(problem.detail);
      } else {
        this.submitProblem.set(problem);
        void this.announcer.announce(`Not submitted. ${problem.detail}`, 'assertive');
      }
    } finally {
      this.submitting.set(false);
    }
  }

  /** The submit's refusal, each field said as a sentence about the run. */
  protected readonly submitMessages = computed(() => (this.submitProblem()?.errors ?? []).map((item) => problemSentence(item)));

  /** Autosave's conflict, shown as a problem with the reload as its retry. */
  protected readonly conflictProblem = computed<ProblemDetails | null>(() => {
    const state = this.autosave.state();
    return state.kind === 'conflict' ? { type: 'about:blank', title: 'Conflict', status: 409, detail: state.detail } : null;
  });

  /** Tag of an instrument the run describes itself (imported runs), when no register instrument is chosen. */
  protected describedInstrument(name: ReadingChannel): string | null {
    return this.value().channels[name].instrumentId === null ? (this.setupBase().channels?.[name]?.instrument ?? null) : null;
  }

  protected ruleBroken(rule: string): boolean {
    return !!this.formErrors()?.[rule];
  }

  /** A broken rule is shown once a field it names was left, or after a submit attempt. */
  protected showRule(rule: string): boolean {
    const c = this.form.controls;
    const fields = { gasRequired: [c.gasId], degreesOfFreedomRequired: [c.degreesOfFreedom], amountRequired: [c.moles, c.mass], processIndexRequired: [c.processIndex] }[rule] ?? [];
    this.value();
    return this.ruleBroken(rule) && (this.triedSubmit() || fields.some((field) => field.touched));
  }

  private async loadRun(id: number): Promise<void> {
    this.loading.set(true);
    try {
      const draft = await firstValueFrom(this.api.get(id));
      if (draft.state !== 'draft' && draft.state !== 'returned') {
        this.locked.set(draft);
        this.loading.set(false);
        return;
      }
      this.returnReason.set(draft.state === 'returned' ? (draft.returnReason ?? null) : null);
      this.setupBase.set(draft.setup);
      this.sheet.set(loadDraft(this.form, draft, this.gases()));
      this.begin(draft);
    } catch (error: unknown) {
      this.fail(error);
    }
  }

  private begin(draft: RunRecord | null): void {
    const source: AutosaveSource = {
      create: () =>
        createBody(this.form, this.gases(), this.setupBase(), this.sheet()) ??
        'give the project, a title of at least 3 characters, the process and the run date first.',
      update: (version) => updateBody(version, this.form, this.gases(), this.setupBase(), this.sheet()),
      readings: (version) => {
        const rows = this.sheet().rowsWithErrors(this.gridColumns());
        if (rows.length) {
          return `fix the readings marked in the grid (reading ${rows.slice(0, 3).map((r) => r + 1).join(', ')}${rows.length > 3 ? ', …' : ''}).`;
        }
        return readingsBody(version, this.form.getRawValue(), this.sheet(), this.setupBase());
      },
    };
    this.autosave.start(source, draft);
    this.loading.set(false);
    if (!this.subscribed) {
      this.subscribed = true;
      const controls = this.form.controls;
      this.form.valueChanges.pipe(takeUntilDestroyed(this.destroyRef)).subscribe(() => this.autosave.changed('fields'));
      merge(controls.channels.valueChanges, controls.timeUnit.valueChanges)
        .pipe(takeUntilDestroyed(this.destroyRef))
        .subscribe(() => this.autosave.changed('readings'));
    }
    setTimeout(() => this.headingFocus.focusHeading());
  }

  private fail(error: unknown): void {
    this.loadProblem.set(toProblem(error));
    this.loading.set(false);
  }
}
