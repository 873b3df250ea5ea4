import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';

import { CreateRunBody, ReadingsBody } from '../run-entry.models';
import { AUTOSAVE_DELAY_MS, AutosaveSource, RunAutosave } from './run-autosave';

const created: CreateRunBody = { projectId: 1, title: 'Argon heating', process: 'isochoric', runDate: '2026-11-30' };

describe('RunAutosave', () => {
  let autosave: RunAutosave;
  let http: HttpTestingController;
  let readings: ReadingsBody | string;
  let title: string;

  const source: AutosaveSource = {
    create: () => created,
    update: (version) => ({ version, title }),
    readings: (version) => (typeof readings === 'string' ? readings : { ...readings, version }),
  };

  /** Lets the awaited HTTP answers run on. */
  async function settle(): Promise<void> {
    for (let i = 0; i < 10; i++) {
      await Promise.resolve();
    }
  }

  beforeEach(() => {
    jest.useFakeTimers();
    TestBed.configureTestingModule({ providers: [RunAutosave, provideHttpClient(), provideHttpClientTesting()] });
    autosave = TestBed.inject(RunAutosave);
    http = TestBed.inject(HttpTestingController);
    readings = { version: 0, time: { unit: 's', values: [0, 10] }, channels: { temperature: { unit: 'degC', values: [21, 22] } } };
    title = 'Argon heating';
  });

  afterEach(() => {
    http.verify();
    jest.useRealTimers();
  });

  it('waits for 1.5 s of quiet after the last change, then creates the run and puts its readings', async () => {
    autosave.start(source, null);
    autosave.changed('fields');
    jest.advanceTimersByTime(AUTOSAVE_DELAY_MS - 100);
    autosave.changed('readings');
    jest.advanceTimersByTime(AUTOSAVE_DELAY_MS - 100);
    http.expectNone('/api/runs');
    expect(autosave.state().kind).toBe('pending');

    jest.advanceTimersByTime(100);
    const post = http.expectOne({ method: 'POST', url: '/api/runs' });
    expect(post.request.body).toEqual(created);
    expect(autosave.state().kind).toBe('saving');
    post.flush({ id: 42, code: 'R-2026-0042', version: 1 });
    await settle();

    const put = http.expectOne({ method: 'PUT', url: '/api/runs/42/readings' });
    expect(put.request.body.version).toBe(1);
    expect(put.request.body.channels.temperature.values).toEqual([21, 22]);
    put.flush({ id: 42, version: 2, readings: 2 });
    await settle();

    expect(autosave.runId()).toBe(42);
    expect(autosave.code()).toBe('R-2026-0042');
    expect(autosave.currentVersion).toBe(2);
    expect(autosave.state().kind).toBe('saved');
  });

  it('patches the fields of a loaded run quoting its version, and sends nothing for readings it did not change', async () => {
    autosave.start(source, { id: 7, code: 'R-2026-0007', version: 5 });
    title = 'Argon heating, second try';
    autosave.changed('fields');
    jest.advanceTimersByTime(AUTOSAVE_DELAY_MS);

    const patch = http.expectOne({ method: 'PATCH', url: '/api/runs/7' });
    expect(patch.request.body).toEqual({ version: 5, title: 'Argon heating, second try' });
    patch.flush({ id: 7, version: 6 });
    await settle();

    http.expectNone('/api/runs/7/readings');
    expect(autosave.currentVersion).toBe(6);
  });

  it('stops on a 409 and keeps the server detail; later changes send nothing', async () => {
    autosave.start(source, { id: 7, code: 'R-2026-0007', version: 5 });
    autosave.changed('fields');
    jest.advanceTimersByTime(AUTOSAVE_DELAY_MS);
    const detail = 'Run R-2026-0007 was changed by someone else since you opened it. Reload the run.';
    http
      .expectOne({ method: 'PATCH', url: '/api/runs/7' })
      .flush({ title: 'Conflict', status: 409, detail, currentVersion: 6 }, { status: 409, statusText: 'Conflict' });
    await settle();

    expect(autosave.state()).toEqual({ kind: 'conflict', detail });
    autosave.changed('fields');
    autosave.changed('readings');
    jest.advanceTimersByTime(AUTOSAVE_DELAY_MS * 3);
    http.expectNone(() => true);
    expect(await autosave.saveNow()).toBe(false);
  });

  it('says why it cannot save yet instead of sending bad readings, and saves once they are fixed', async () => {
    autosave.start(source, { id: 7, code: 'R-2026-0007', version: 5 });
    readings = 'fix the readings marked in the grid (reading 3).';
    autosave.changed('readings');
    jest.advanceTimersByTime(AUTOSAVE_DELAY_MS);
    await settle();
    http.expectNone('/api/runs/7/readings');
    expect(autosave.state()).toEqual({ kind: 'failed', reason: 'fix the readings marked in the grid (reading 3).' });

    readings = { version: 0, time: { unit: 's', values: [0] }, channels: {} };
    autosave.changed('readings');
    jest.advanceTimersByTime(AUTOSAVE_DELAY_MS);
    http.expectOne({ method: 'PUT', url: '/api/runs/7/readings' }).flush({ id: 7, version: 6, readings: 1 });
    await settle();
    expect(autosave.state().kind).toBe('saved');
  });

  it('keeps the change waiting after a server refusal and reports the reason', async () => {
    autosave.start(source, { id: 7, code: 'R-2026-0007', version: 5 });
    autosave.changed('fields');
    jest.advanceTimersByTime(AUTOSAVE_DELAY_MS);
    http.expectOne({ method: 'PATCH', url: '/api/runs/7' }).flush(
      { title: 'Bad request', status: 400, detail: 'Some fields are not valid.', errors: [{ field: 'title', message: 'title must be 3 to 200 characters' }] },
      { status: 400, statusText: 'Bad Request' },
    );
    await settle();
    expect(autosave.state()).toEqual({ kind: 'failed', reason: 'Some fields are not valid. title must be 3 to 200 characters' });

    const saved = autosave.saveNow();
    http.expectOne({ method: 'PATCH', url: '/api/runs/7' }).flush({ id: 7, version: 6 });
    expect(await saved).toBe(true);
  });
});
