import { DestroyRef, Injectable, inject, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';

import { toProblem } from '../../../core/http/problem-details';
import { RunsApi } from '../runs-api';
import { CreateRunBody, ReadingsBody, UpdateRunBody } from '../run-entry.models';

/** Where the draft stands against the server, for the saved indicator. */
export type SaveState =
  | { kind: 'idle' }
  | { kind: 'pending' }
  | { kind: 'saving' }
  | { kind: 'saved'; at: Date }
  | { kind: 'failed'; reason: string }
  | { kind: 'conflict'; detail: string };

/** What the page hands autosave: each body built from the current form, or why it cannot be yet. */
export interface AutosaveSource {
  create(): CreateRunBody | string;
  update(version: number): UpdateRunBody;
  readings(version: number): ReadingsBody | string;
}

/** Quiet time after the last change before a draft is saved. */
export const AUTOSAVE_DELAY_MS = 1500;

/**
 * Saves a draft a moment after the last change: the first save creates the run, later ones PATCH
 * the fields and PUT the readings, always quoting the version last seen. A 409 stops autosaving
 * for good: the page asks the person to reload rather than overwrite someone else's change.
 */
@Injectable()
export class RunAutosave {
  private readonly api = inject(RunsApi);

  readonly state = signal<SaveState>({ kind: 'idle' });
  readonly runId = signal<number | null>(null);
  readonly code = signal<string | null>(null);

  private source: AutosaveSource | null = null;
  private version = 0;
  private fieldsDirty = false;
  private readingsDirty = false;
  private timer: ReturnType<typeof setTimeout> | null = null;
  private running: Promise<boolean> | null = null;

  constructor() {
    inject(DestroyRef).onDestroy(() => {
      // Leaving the page keeps what was typed: save what is still waiting, once.
      const waiting = this.timer !== null;
      this.clearTimer();
      if (waiting) {
        void this.save();
      }
    });
  }

  /** Starts over for a new run (null) or a loaded one; nothing is waiting to be saved. */
  start(source: AutosaveSource, run: { id: number; code: string; version: number } | null): void {
    this.clearTimer();
    this.source = source;
    this.runId.set(run?.id ?? null);
    this.code.set(run?.code ?? null);
    this.version = run?.version ?? 0;
    this.fieldsDirty = false;
    this.readingsDirty = false;
    this.state.set({ kind: 'idle' });
  }

  /** The run's version as last answered by the server. */
  get currentVersion(): number {
    return this.version;
  }

  get stopped(): boolean {
    return this.state().kind === 'conflict';
  }

  /** Notes a change and restarts the quiet-time clock. */
  changed(what: 'fields' | 'readings'): void {
    if (this.stopped || !this.source) {
      return;
    }
    if (what === 'fields') {
      this.fieldsDirty = true;
    } else {
      this.readingsDirty = true;
    }
    this.state.set({ kind: 'pending' });
    this.clearTimer();
    this.timer = setTimeout(() => {
      this.timer = null;
      void this.save();
    }, AUTOSAVE_DELAY_MS);
  }

  /** Saves now (before submit); true when the server holds everything typed. */
  async saveNow(): Promise<boolean> {
    this.clearTimer();
    if (this.runId() === null) {
      this.fieldsDirty = true;
    }
    return this.save();
  }

  /** Stops autosave after a conflict found elsewhere (e.g. on submit). */
  conflict(detail: string): void {
    this.clearTimer();
    this.state.set({ kind: 'conflict', detail });
  }

  private async save(): Promise<boolean> {
    while (this.running) {
      await this.running;
    }
    if (this.stopped) {
      return false;
    }
    if (!this.fieldsDirty && !this.readingsDirty) {
      return this.state().kind !== 'failed';
    }
    this.running = this.write();
    try {
      return await this.running;
    } finally {
      this.running = null;
    }
  }

  private async write(): Promise<boolean> {
    const source = this.source!;
    const fields = this.fieldsDirty;
    const readings = this.readingsDirty;
    this.fieldsDirty = false;
    this.readingsDirty = false;
    const giveBack = () => {
      this.fieldsDirty ||= fields;
      this.readingsDirty ||= readings;
    };
    try {
      let id = this.runId();
      if (id === null) {
        const body = source.create();
        if (typeof body === 'string') {
          giveBack();
          this.state.set({ kind: 'failed', reason: body });
          return false;
        }
        this.state.set({ kind: 'saving' });
        const run = await firstValueFrom(this.api.create(body));
        id = run.id;
        this.version = run.version;
        this.runId.set(run.id);
        this.code.set(run.code ?? null);
      } else if (fields) {
        this.state.set({ kind: 'saving' });
        this.version = (await firstValueFrom(this.api.update(id, source.update(this.version)))).version;
      }
      if (readings) {
        const body = source.readings(this.version);
        if (typeof body === 'string') {
          this.readingsDirty = true;
          this.state.set({ kind: 'failed', reason: body });
          return false;
        }
        this.state.set({ kind: 'saving' });
        this.version = (await firstValueFrom(this.api.replaceReadings(id, body))).version;
      }
      if (this.fieldsDirty || this.readingsDirty) {
        // More was typed while this save was on its way.
        this.changed(this.fieldsDirty ? 'fields' : 'readings');
      } else {
        this.state.set({ kind: 'saved', at: new Date() });
      }
      return !this.fieldsDirty && !this.readingsDirty;
    } catch (error: unknown) {
      const problem = toProblem(error);
      if (problem.status === 409) {
        this.conflict(problem.detail);
        return false;
      }
      giveBack();
      const first = problem.errors?.[0];
      this.state.set({ kind: 'failed', reason: first ? `${problem.detail} ${first.message}` : problem.detail });
      return false;
    }
  }

  private clearTimer(): void {
    if (this.timer !== null) {
      clearTimeout(this.timer);
      this.timer = null;
    }
  }
}
